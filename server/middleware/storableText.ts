import type { NextFunction, Request, Response } from 'express'
import { HttpError } from '../lib/httpError'

/**
 * Text PostgreSQL cannot store: a NUL character (text and jsonb refuse it) or half of a UTF-16
 * surrogate pair (it has no UTF-8 form; jsonb refuses its escape). In a JSON body either can only
 * arrive written as a \u escape, so bodies without "\u" are not walked at all.
 */
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/
const MESSAGE = 'holds a character that cannot be stored (a NUL, or half of a UTF-16 pair)'

const escapesSeen = new WeakSet<Request>()

/** express.json's `verify` hook: notes the bodies whose text has a \u escape. */
export function noteUnicodeEscapes(req: Request, _res: Response, raw: Buffer) {
  if (raw.includes('\\u')) escapesSeen.add(req)
}

/** The path of the first key or string in `value` that cannot be stored, or null. */
export function unstorableField(value: unknown, path: string): string | null {
  if (typeof value === 'string') return UNSTORABLE.test(value) ? path : null
  if (value === null || typeof value !== 'object') return null
  for (const [key, inner] of Object.entries(value)) {
    const at = `${path}.${key}`
    if (UNSTORABLE.test(key)) return at
    const found = unstorableField(inner, at)
    if (found) return found
  }
  return null
}

function refusal(field: string) {
  return new HttpError(400, 'invalid_input', `${field}: ${MESSAGE}`, [{ field, message: MESSAGE }])
}

/** For fields that arrive another way (a multipart form's): throws the same 400. */
export function assertStorableText(value: unknown, path: string) {
  const field = unstorableField(value, path)
  if (field) throw refusal(field)
}

/** 400 before any route runs, naming the field, instead of a database error halfway through. */
export function refuseUnstorableText(req: Request, _res: Response, next: NextFunction) {
  // %00 in the address decodes to NUL; a lone surrogate cannot be percent-encoded (it is not UTF-8).
  let field = /%00/.test(req.originalUrl) ? 'address' : null
  if (!field && escapesSeen.has(req)) field = unstorableField(req.body, 'body')
  next(field ? refusal(field) : undefined)
}
