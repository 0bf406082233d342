import request from 'supertest'
import type { Express } from 'express'
import type { RouteEntry } from '../../../server/api/secureRouter'
import type { Role } from '../../../shared/api/roles'

/** Hostile values, each sent in place of one field. `raw` ones are written into the JSON text as is. */
export const SQL = "'; DROP TABLE lots; --"
export const SCRIPT = '<script>alert(1)</script>'
export const ONE_MB = 'x'.repeat(1024 * 1024)
export const HOSTILE: { label: string; value?: unknown; raw?: string }[] = [
  { label: '"NaN"', value: 'NaN' },
  { label: '"Infinity"', value: 'Infinity' },
  { label: '"-Infinity"', value: '-Infinity' },
  { label: '"1e308"', value: '1e308' },
  { label: '1e308', value: 1e308 },
  { label: '-1e308', value: -1e308 },
  { label: '2^31 (beyond int4)', value: 2147483648 },
  { label: '2^53+1 (beyond a safe integer)', raw: '9007199254740993' },
  { label: '1e999 (Infinity once parsed)', raw: '1e999' },
  { label: '-1e999', raw: '-1e999' },
  { label: '-1', value: -1 },
  { label: '0.5', value: 0.5 },
  { label: '1 MB string', value: ONE_MB },
  { label: 'SQL-shaped', value: SQL },
  { label: 'script-shaped', value: SCRIPT },
  { label: 'null', value: null },
  { label: 'true', value: true },
  { label: '[]', value: [] },
  { label: '{}', value: {} },
  { label: '""', value: '' },
  { label: 'an impossible date', value: '2026-02-30' },
  { label: 'max int4', value: 2147483647 },
  // PostgreSQL's text and jsonb cannot hold a NUL (PostgreSQL manual, character and JSON types);
  // a lone surrogate has no UTF-8 form (RFC 3629 §3). Both cited from memory.
  { label: 'a NUL inside text', value: 'Lot\u0000A' },
  { label: 'half a UTF-16 pair', value: 'Lot\ud800A' },
]

/** Malformed JSON texts sent with Content-Type: application/json. */
export const MALFORMED = [
  '{"a":',
  '{"a": NaN}',
  '{"a": Infinity}',
  "{'a': 1}",
  '{"a":1}}',
  '\u0000',
]
/** Valid JSON that is not an object. */
export const NOT_AN_OBJECT = ['[]', '"text"', '123', 'null', 'true', '[{"a":1}]']

type Seg = string | number

/** Every field path in a body (objects' keys; an array's first element stands for all). */
export function fieldPaths(value: unknown, prefix: Seg[] = []): Seg[][] {
  const out: Seg[][] = []
  if (Array.isArray(value)) {
    if (value.length > 0) out.push([...prefix, 0], ...fieldPaths(value[0], [...prefix, 0]))
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value))
      out.push([...prefix, k], ...fieldPaths(v, [...prefix, k]))
  }
  return out
}

const RAW_MARK = '__raw_value__'

/** The body as JSON text with the value at `path` replaced by the hostile one. */
export function withHostile(body: unknown, path: Seg[], hostile: (typeof HOSTILE)[number]): string {
  const copy = structuredClone(body) as Record<Seg, unknown>
  let node = copy
  for (const seg of path.slice(0, -1)) node = node[seg] as Record<Seg, unknown>
  node[path[path.length - 1]!] = hostile.raw === undefined ? hostile.value : RAW_MARK
  const text = JSON.stringify(copy)
  return hostile.raw === undefined ? text : text.replace(`"${RAW_MARK}"`, hostile.raw)
}

/** The role a generated request signs in as: one the route allows, QA first (it may do most). */
export function callerFor(route: RouteEntry): Role | null {
  if (route.roles === 'public') return null
  const prefer: Role[] = ['supervisor', 'admin', 'operator', 'manager', 'customer']
  return prefer.find((r) => (route.roles as readonly Role[]).includes(r)) ?? null
}

export function send(
  app: Express,
  method: string,
  path: string,
  auth: string | null,
  text: string,
  contentType = 'application/json',
) {
  const req = request(app)[method as 'post'](path).set('Content-Type', contentType)
  if (auth) req.set('Authorization', auth)
  return req.send(text)
}

/** What is wrong with an answer to a hostile request, or null: 4xx/2xx JSON, the error body, no 5xx. */
export function problemWith(res: request.Response, label: string, hostile?: string): string | null {
  const what = `${label} → ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`
  if (res.status >= 500) return what
  if (!/^application\/json/.test(res.headers['content-type'] ?? '')) {
    return `${what}: content-type ${res.headers['content-type']}`
  }
  if (res.status >= 400) {
    const e = res.body?.error
    if (typeof e?.code !== 'string' || typeof e?.message !== 'string' || !e.message) {
      return `${what}: no { error: { code, message } }`
    }
  } else {
    if (hostile === '1 MB string') return `${what}: a 1 MB string was accepted`
    // Stored as typed: the server neither escapes nor strips; the client escapes on render.
    if (/&lt;script|&#39;|&quot;/.test(res.text))
      return `${what}: the answer holds HTML-escaped text`
  }
  return null
}
