import rateLimit from 'express-rate-limit'
import { secureRouter } from '../secureRouter'
import { loginSchema, unitPreferencesSchema } from '../../../shared/api/auth'
import { env } from '../../config/env'
import { login } from './auth.service'
import { toSessionUser } from '../../middleware/auth'
import { ROLES } from '../../../shared/api/roles'

const r = secureRouter('/api/auth')

/** Per address: LOGIN_RATE_LIMIT sign-in attempts a minute (the account lockout is separate). */
r.router.use(
  '/login',
  rateLimit({
    windowMs: 60_000,
    limit: env.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    handler: (_req, res) =>
      res.status(429).json({
        error: { code: 'rate_limited', message: 'Too many sign-in attempts from here; wait a minute and try again' },
      }),
  }),
)

r.post('/login', { roles: 'public', body: loginSchema }, ({ body }) => login(body.email, body.password))

r.get('/me', { roles: ROLES }, ({ user }) => ({ user: toSessionUser(user) }))

r.patch('/me/preferences', { roles: ROLES, body: unitPreferencesSchema }, async ({ user, body }) => {
  await user.update(body)
  return { user: toSessionUser(user) }
})

export const authRouter = r
