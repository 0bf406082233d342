import { secureRouter } from '../secureRouter'
import { sequelize } from '../../db'

const r = secureRouter('/api/health')

/**
 * A hung database (frozen host, lost network) never refuses a connection, it just never answers:
 * health must still answer at once, so a monitor sees 503 rather than a hanging request.
 */
export const HEALTH_TIMEOUT_MS = 2000

function withinMs<T>(work: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined
  const late = new Promise<never>((_, reject) => {
    timer = setTimeout(
      () => reject(new Error(`PostgreSQL did not answer within ${ms / 1000} s`)),
      ms,
    )
  })
  return Promise.race([work, late]).finally(() => clearTimeout(timer))
}

/** 200 `{ status: 'ok', db: 'ok' }`, or 503 with the reason while PostgreSQL cannot be reached. */
r.get('/', { roles: 'public' }, async ({ res }) => {
  try {
    await withinMs(sequelize.query('SELECT 1'), HEALTH_TIMEOUT_MS)
    return { status: 'ok', db: 'ok' }
  } catch (err) {
    res.status(503)
    return { status: 'degraded', db: 'unreachable', reason: (err as Error).message }
  }
})

export const healthRouter = r
