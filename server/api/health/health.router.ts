import { secureRouter } from '../secureRouter'
import { sequelize } from '../../db'

const r = secureRouter('/api/health')

/** 200 `{ status: 'ok', db: 'ok' }`, or 503 with the reason while PostgreSQL cannot be reached. */
r.get('/', { roles: 'public' }, async ({ res }) => {
  try {
    await sequelize.query('SELECT 1')
    return { status: 'ok', db: 'ok' }
  } catch (err) {
    res.status(503)
    return { status: 'degraded', db: 'unreachable', reason: (err as Error).message }
  }
})

export const healthRouter = r
