import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, STAFF } from '../../../shared/api/roles'
import { verificationSchema } from '../../../shared/api/lots'
import { listVerifications, recordVerification } from './verifications.service'

/** Shift verifications of an instrument, under the instruments path the contract names. */
export const verificationsRouter = secureRouter('/api/instruments')

verificationsRouter.post(
  '/:id/verifications',
  { roles: FLOOR, params: idParams, body: verificationSchema },
  async ({ res, params, body, user }) => {
    const { result, created } = await recordVerification(user, params.id, body)
    res.status(created ? 201 : 200)
    return result
  },
)

verificationsRouter.get('/:id/verifications', { roles: STAFF, params: idParams }, ({ params }) =>
  listVerifications(params.id),
)
