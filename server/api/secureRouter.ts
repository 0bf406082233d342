import { Router, type Request, type Response } from 'express'
import { z, type ZodType } from 'zod'
import { authenticate } from '../middleware/auth'
import { HttpError } from '../lib/httpError'
import type { Role } from '../../shared/api/roles'
import type { User } from '../db/models'

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

/** Every API route with the roles that may call it: the authorisation matrix test reads this table. */
export interface RouteEntry {
  method: Method
  path: string
  roles: readonly Role[] | 'public'
}
export const routeTable: RouteEntry[] = []

export interface RouteOptions<P extends ZodType, Q extends ZodType, B extends ZodType> {
  roles: readonly Role[] | 'public'
  params?: P
  query?: Q
  body?: B
}

export interface RouteContext<P, Q, B> {
  req: Request
  res: Response
  params: P
  query: Q
  body: B
  /** The signed-in user; on a 'public' route it is undefined. */
  user: User
}

type Handler<P, Q, B> = (ctx: RouteContext<P, Q, B>) => unknown

function parse<T extends ZodType>(schema: T | undefined, value: unknown, where: string): z.infer<T> {
  if (!schema) return value as z.infer<T>
  const result = schema.safeParse(value ?? {})
  if (result.success) return result.data
  const details = result.error.issues.map((i) => ({
    field: [where, ...i.path].join('.'),
    message: i.message,
  }))
  const first = details[0]
  throw new HttpError(400, 'invalid_input', first ? `${first.field}: ${first.message}` : 'Invalid input', details)
}

/**
 * A router whose every route states its roles and its zod schemas. Order per request:
 * authenticate → role check → validate params, query, body → handler(ctx).
 * What the handler returns (if not undefined and nothing was sent) is sent as JSON.
 */
export function secureRouter(basePath: string) {
  const router = Router()
  const add =
    (method: Method) =>
    <P extends ZodType = ZodType<Record<string, string>>, Q extends ZodType = ZodType<Record<string, unknown>>, B extends ZodType = ZodType<unknown>>(
      path: string,
      options: RouteOptions<P, Q, B>,
      handler: Handler<z.infer<P>, z.infer<Q>, z.infer<B>>,
    ) => {
      routeTable.push({ method, path: (basePath + path).replace(/\/$/, '') || '/', roles: options.roles })
      const chain = options.roles === 'public' ? [] : [authenticate]
      router[method](path, ...chain, async (req: Request, res: Response) => {
        const roles = options.roles
        if (roles !== 'public' && !roles.includes(req.user!.role)) {
          throw new HttpError(403, 'forbidden', 'Your role may not do this')
        }
        const ctx: RouteContext<z.infer<P>, z.infer<Q>, z.infer<B>> = {
          req,
          res,
          params: parse(options.params, req.params, 'params'),
          query: parse(options.query, req.query, 'query'),
          body: parse(options.body, req.body, 'body'),
          user: req.user as User,
        }
        const result = await handler(ctx)
        if (result !== undefined && !res.headersSent) res.json(result)
      })
    }
  return {
    router,
    basePath,
    get: add('get'),
    post: add('post'),
    put: add('put'),
    patch: add('patch'),
    delete: add('delete'),
  }
}

/** `:id` params as positive integers; a non-number id is a 404 rather than a 500. */
export const idParams = z.object({ id: z.coerce.number().int().positive().max(2147483647) })
