import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, QA, STAFF } from '../../../shared/api/roles'
import {
  NC_STATUSES,
  closeNcSchema,
  createNcSchema,
  dispositionSchema,
} from '../../../shared/api/review'
import { createManualNc } from './nc.create'
import { ncDetail, listNcs } from './nc.rows'
import { uploadNcPhoto } from './nc.photos'
import { closeNc, dispositionNc } from './disposition.service'

/** Nonconformance records: opened on the floor or at the desk, dispositioned and closed by QA. */
export const nonconformancesRouter = secureRouter('/api/nonconformances')

const listQuery = z.object({
  status: z.enum(NC_STATUSES).optional(),
  lotId: z.coerce.number().int().positive().max(2147483647).optional(),
})

nonconformancesRouter.get('/', { roles: STAFF, query: listQuery }, ({ query }) => listNcs(query))

const FLOOR_AND_QA = [...new Set([...FLOOR, ...QA])]

nonconformancesRouter.post(
  '/',
  { roles: FLOOR_AND_QA, body: createNcSchema },
  async ({ user, body, res }) => {
    res.status(201)
    return createManualNc(user, body)
  },
)

nonconformancesRouter.get('/:id', { roles: STAFF, params: idParams }, ({ params }) =>
  ncDetail(params.id),
)

nonconformancesRouter.post(
  '/:id/disposition',
  { roles: QA, params: idParams, body: dispositionSchema },
  ({ user, params, body }) => dispositionNc(user, params.id, body),
)

nonconformancesRouter.post(
  '/:id/close',
  { roles: QA, params: idParams, body: closeNcSchema },
  ({ user, params, body }) => closeNc(user, params.id, body),
)

nonconformancesRouter.post(
  '/:id/photos',
  { roles: FLOOR_AND_QA, params: idParams },
  async ({ req, res, params, user }) => {
    const { photo, created } = await uploadNcPhoto(user, params.id, req, res)
    res.status(created ? 201 : 200)
    return photo
  },
)
