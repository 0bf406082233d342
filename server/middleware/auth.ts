import passport from 'passport'
import jwt from 'jsonwebtoken'
import { createSecretKey } from 'node:crypto'
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt'
import type { NextFunction, Request, Response } from 'express'
import { env } from '../config/env'
import { HttpError } from '../lib/httpError'
import { User } from '../db/models'
import { findSignedInUser } from './userCache'
import { rememberVerifiedTokens } from './verifiedTokens'
import type { SessionUser } from '../../shared/api/auth'

/**
 * The HMAC key as a KeyObject, made once. Given a string, jsonwebtoken first tries to read it
 * as a PEM public key (and throws) before making a secret key, on every sign and every verify:
 * that cost more than the rest of sign-in checking together. Same bytes, same signatures.
 */
const jwtKey = createSecretKey(Buffer.from(env.jwtSecret, 'utf8'))

interface TokenClaims {
  sub: string
  tv: number
}

rememberVerifiedTokens()
passport.use(
  new JwtStrategy(
    {
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      // passport-jwt hands the key to jsonwebtoken untouched; its types just predate KeyObject
      secretOrKey: jwtKey as unknown as Buffer,
      algorithms: ['HS256'],
    },
    (claims: TokenClaims, done: (err: unknown, user?: User | false) => void) => {
      // A subject that is no user id (missing, text, beyond the integer column) is a refused
      // token, not a database error.
      const userId = Number(claims.sub)
      if (!/^[1-9]\d{0,9}$/.test(String(claims.sub)) || userId > 2147483647)
        return done(null, false)
      findSignedInUser(userId)
        .then((user) => {
          // A deactivated user, or a token issued before a password reset, no longer signs in.
          if (!user || !user.active || user.tokenVersion !== claims.tv) return done(null, false)
          return done(null, user)
        })
        .catch((err: unknown) => done(err))
    },
  ),
)

export function signToken(user: User): string {
  return jwt.sign({ tv: user.tokenVersion }, jwtKey, {
    algorithm: 'HS256',
    subject: String(user.id),
    expiresIn: env.JWT_TTL_SECONDS,
  })
}

export function toSessionUser(user: User): SessionUser {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    customerId: user.customerId,
    thicknessUnit: user.thicknessUnit,
    temperatureUnit: user.temperatureUnit,
    areaUnit: user.areaUnit,
  }
}

/** Puts the signed-in user on req.user, or answers 401. */
export function authenticate(req: Request, res: Response, next: NextFunction) {
  passport.authenticate('jwt', { session: false }, (err: unknown, user: User | false) => {
    if (err) return next(err)
    if (!user)
      return next(
        new HttpError(
          401,
          'unauthenticated',
          'Sign in again: your session is missing or has expired',
        ),
      )
    req.user = user
    next()
  })(req, res, next)
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends InstanceType<typeof import('../db/models/User').User> {}
  }
}
