import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, QA, STAFF } from '../../../shared/api/roles'
import { NC_STATUSES, closeNcSchema, createNcSchema, dispositionSchema } from '../../../shared/api/review'
import { createManualNc } from './nc.create'
import { ncRow, ncRows } from './nc.rows'
import { closeNc, dispositionNc } from './disposition.service'

/** Nonconformance records: opened on the floor or at the desk, dispositioned and closed by QA. */
export const nonconformancesRouter = secureRouter('/api/nonconformances')

const listQuery = z.object({
  status: z.enum(NC_STATUSES).optional(),
  lotId: z.coerce.number().int().positive().max(2147483647).optional(),
})

nonconformancesRouter.get('/', { roles: STAFF, query: listQuery }, ({ query }) => {
  const where: string[] = []
  const bind: unknown[] = []
  if (query.status) where.push(`n.status = $${bind.push(query.status)}`)
  if (query.lotId) where.push(`n.lot_id = $${bind.push(query.lotId)}`)
  return ncRows(where.join(' AND '), bind)
})

const FLOOR_AND_QA = [...new Set([...FLOOR, ...QA])]

nonconformancesRouter.post('/', { roles: FLOOR_AND_QA, body: createNcSchema }, async ({ user, body, res }) => {
  res.status(201)
  return createManualNc(user, body)
})

nonconformancesRouter.get('/:id', { roles: STAFF, params: idParams }, ({ params }) => ncRow(params.id))

nonconformancesRouter.post(
  '/:id/disposition',
  { roles: QA, params: idParams, body: dispositionSchema },
  ({ user, params, body }) => dispositionNc(user, params.id, body),
)

nonconformancesRouter.post('/:id/close', { roles: QA, params: idParams, body: closeNcSchema }, ({ user, params, body }) =>
  closeNc(user, params.id, body),
)
