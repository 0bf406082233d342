import { Strategy as JwtStrategy } from 'passport-jwt'

type Verifier = (
  token: string,
  key: unknown,
  options: unknown,
  done: (err: Error | null, payload?: unknown) => void,
) => void

/** How many verified tokens are remembered: the tablets and desks of a plant, with room to spare. */
const REMEMBERED_MAX = 2000

/**
 * Remembers tokens whose signature passed, until they expire. A tablet sends the same token with
 * every request, and checking its HMAC again each time cost about a twentieth of a readings POST's
 * server CPU. The key is the whole token, signature included, so any other token (a tampered one
 * too) is verified in full; expiry is checked again on every use; the user checks (active, token
 * version after a password reset) still run on every request, after this. Only tokens with an
 * expiry are remembered. Installed once, on passport-jwt's own verifier hook.
 */
export function rememberVerifiedTokens() {
  const strategy = JwtStrategy as unknown as { JwtVerifier: Verifier & { remembering?: true } }
  if (strategy.JwtVerifier.remembering) return
  const verify = strategy.JwtVerifier
  const verified = new Map<string, { payload: unknown; expiresAtMs: number }>()
  const remembering: Verifier = (token, key, options, done) => {
    const known = verified.get(token)
    if (known && Date.now() < known.expiresAtMs) return done(null, known.payload)
    if (known) verified.delete(token)
    verify(token, key, options, (err, payload) => {
      const exp = (payload as { exp?: unknown } | undefined)?.exp
      if (!err && typeof exp === 'number') {
        // the oldest first (a Map keeps insertion order)
        if (verified.size >= REMEMBERED_MAX) verified.delete(verified.keys().next().value!)
        verified.set(token, { payload, expiresAtMs: exp * 1000 })
      }
      done(err, payload)
    })
  }
  strategy.JwtVerifier = Object.assign(remembering, { remembering: true as const })
}
