import { z } from 'zod'
import { secureRouter, idParams } from '../secureRouter'
import { ADMIN, STAFF } from '../../../shared/api/roles'
import { createSpecSchema, updateSpecSchema } from '../../../shared/api/setup'
import {
  createSpec,
  getSpecDetail,
  getSpecVersionRow,
  listSpecs,
  updateSpec,
} from './specs.service'

/** Setup → Coating specs, versioned. Staff read (a lot is inspected against one); admins write. */
const r = secureRouter('/api/specs')

const versionParams = idParams.extend({ version: z.coerce.number().int().positive().max(100000) })

r.get('/', { roles: STAFF }, () => listSpecs())

r.get('/:id', { roles: STAFF, params: idParams }, ({ params }) => getSpecDetail(params.id))

r.get('/:id/versions/:version', { roles: STAFF, params: versionParams }, ({ params }) =>
  getSpecVersionRow(params.id, params.version),
)

r.post('/', { roles: ADMIN, body: createSpecSchema }, async ({ user, body, res }) => {
  res.status(201)
  return createSpec(user, body)
})

r.put(
  '/:id',
  { roles: ADMIN, params: idParams, body: updateSpecSchema },
  ({ user, params, body }) => updateSpec(user, params.id, body),
)

export const specsRouter = r
