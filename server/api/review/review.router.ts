import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, QA, STAFF } from '../../../shared/api/roles'
import { decisionSchema, reopenSchema } from '../../../shared/api/review'
import { lotHistory } from '../audit/audit.query'
import { submitLot } from './submit.service'
import { decideLot, listDecisions } from './decisions.service'
import { reopenLot } from './reopen.service'
import { reviewQueue } from './queue.service'

/** QA review routes that hang under a lot: submit, decide, reopen, and the lot's history. */
export const lotReviewRouter = secureRouter('/api/lots')

/** The version is optional here: the tablet submits what it has, the lot's state is checked under lock. */
const submitSchema = z.object({ version: z.number().int().min(1).optional() })

lotReviewRouter.post(
  '/:id/submit',
  { roles: FLOOR, params: idParams, body: submitSchema },
  ({ user, params, body }) => submitLot(user, params.id, body.version),
)

lotReviewRouter.post(
  '/:id/decisions',
  { roles: QA, params: idParams, body: decisionSchema },
  async ({ user, params, body, res }) => {
    res.status(201)
    return decideLot(user, params.id, body)
  },
)

lotReviewRouter.get('/:id/decisions', { roles: STAFF, params: idParams }, ({ params }) =>
  listDecisions(params.id),
)

lotReviewRouter.post(
  '/:id/reopen',
  { roles: QA, params: idParams, body: reopenSchema },
  ({ user, params, body }) => reopenLot(user, params.id, body),
)

lotReviewRouter.get('/:id/history', { roles: STAFF, params: idParams }, ({ params }) =>
  lotHistory(params.id),
)

/** The supervisor's queue. */
export const reviewRouter = secureRouter('/api/review')

reviewRouter.get('/queue', { roles: QA, query: z.object({}) }, () => reviewQueue())
