import { secureRouter } from '../secureRouter'
import { ADMIN } from '../../../shared/api/roles'
import { auditQuerySchema, searchAudit } from './audit.query'

/** The audit trail, searched by admins. A lot's own history is under /api/lots/:id/history. */
export const auditRouter = secureRouter('/api/audit')

auditRouter.get('/', { roles: ADMIN, query: auditQuerySchema }, async ({ res, query }) => {
  const { rows, total } = await searchAudit(query)
  res.setHeader('X-Total-Count', String(total))
  return rows
})
