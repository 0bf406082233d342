import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, STAFF } from '../../../shared/api/roles'
import {
  createLotSchema,
  lotListQuerySchema,
  partBodySchema,
  updateLotSchema,
} from '../../../shared/api/lots'
import { getLotDetail, listLots, openLot, updateLot } from './lots.service'
import { addPart } from '../parts/parts.service'

export const lotsRouter = secureRouter('/api/lots')

lotsRouter.get('/', { roles: STAFF, query: lotListQuerySchema }, async ({ res, query }) => {
  const { rows, total } = await listLots(query)
  res.setHeader('X-Total-Count', String(total))
  return rows
})

lotsRouter.post('/', { roles: FLOOR, body: createLotSchema }, async ({ res, body, user }) => {
  const { lot, created } = await openLot(user, body)
  res.status(created ? 201 : 200)
  return lot
})

lotsRouter.get('/:id', { roles: STAFF, params: idParams }, ({ params }) => getLotDetail(params.id))

lotsRouter.patch(
  '/:id',
  { roles: FLOOR, params: idParams, body: updateLotSchema },
  ({ params, body, user }) => updateLot(user, params.id, body),
)

lotsRouter.post(
  '/:id/parts',
  { roles: FLOOR, params: idParams, body: partBodySchema },
  async ({ res, params, body, user }) => {
    const { part, created } = await addPart(user, params.id, body)
    res.status(created ? 201 : 200)
    return part
  },
)
