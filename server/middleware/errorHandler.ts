import type { NextFunction, Request, Response } from 'express'
import {
  ValidationError,
  UniqueConstraintError,
  ForeignKeyConstraintError,
  ConnectionError,
  DatabaseError,
} from 'sequelize'
import { HttpError } from '../lib/httpError'
import { logger } from '../lib/logger'
import { env } from '../config/env'

export function notFoundHandler(req: Request, _res: Response, next: NextFunction) {
  next(new HttpError(404, 'not_found', `No such route: ${req.method} ${req.path}`))
}

/** Rule functions in shared/ throw errors named RuleInputError: bad numbers from a client. */
function isRuleInputError(err: unknown): err is Error & { field?: string } {
  return err instanceof Error && err.name === 'RuleInputError'
}

/**
 * PostgreSQL's "this value does not fit" codes: number out of range (22003), no such date or time
 * (22007, 22008), text that is no number (22P02). A schema should have refused the value; when
 * one misses a limit, the client still gets a 400, and the log says which query it was.
 */
const PG_BAD_VALUE = new Set(['22003', '22007', '22008', '22P02'])

/** The one place an error becomes a response: `{ error: { code, message, details? } }`. */
export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction) {
  let status = 500
  let code = 'internal'
  let message =
    'Something went wrong on the server; nothing was saved. Try again, and tell an admin if it repeats.'
  let details: unknown
  const e = err as { status?: number; type?: string; message?: string }
  if (err instanceof HttpError) {
    ;({ status, code, message, details } = err)
  } else if (isRuleInputError(err)) {
    status = 400
    code = 'invalid_input'
    message = err.message
    details = err.field ? [{ field: err.field, message: err.message }] : undefined
  } else if (err instanceof UniqueConstraintError) {
    status = 409
    code = 'duplicate'
    message = 'A record with the same unique value already exists'
    details = err.errors.map((x) => ({ field: x.path, message: x.message }))
  } else if (err instanceof ValidationError) {
    status = 400
    code = 'invalid_input'
    message = err.errors[0]?.message ?? 'Invalid input'
    details = err.errors.map((x) => ({ field: x.path, message: x.message }))
  } else if (err instanceof ForeignKeyConstraintError) {
    status = 400
    code = 'invalid_reference'
    message = 'A referenced record does not exist'
  } else if (
    err instanceof DatabaseError &&
    PG_BAD_VALUE.has((err.parent as { code?: string }).code ?? '')
  ) {
    status = 400
    code = 'invalid_input'
    message = 'A value is out of range here (a number too large, or a date that does not exist)'
    logger.warn(
      { err, method: req.method, url: req.originalUrl },
      'a value passed validation but not PostgreSQL',
    )
  } else if (err instanceof ConnectionError) {
    status = 503
    code = 'database_unavailable'
    message = 'The database cannot be reached right now; nothing was saved. Try again shortly.'
  } else if (e?.type === 'entity.parse.failed') {
    status = 400
    code = 'malformed_json'
    message = 'The request body is not valid JSON'
  } else if (e?.type === 'entity.too.large') {
    status = 413
    code = 'too_large'
    message = 'The request body is too large'
  } else if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
    status = e.status
    code = 'bad_request'
    message = e.message ?? 'Bad request'
  }
  if (status >= 500)
    logger.error({ err, method: req.method, url: req.originalUrl }, 'request failed')
  const body: { error: { code: string; message: string; details?: unknown; stack?: string } } = {
    error: { code, message, ...(details === undefined ? {} : { details }) },
  }
  if (status >= 500 && env.NODE_ENV === 'development' && err instanceof Error)
    body.error.stack = err.stack
  res.status(status).json(body)
}
