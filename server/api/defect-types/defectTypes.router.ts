import { z } from 'zod'
import { secureRouter, idParams } from '../secureRouter'
import { ADMIN, STAFF } from '../../../shared/api/roles'
import { defectTypeSchema } from '../../../shared/api/review'
import { createDefectType, listDefectTypes, updateDefectType } from './defectTypes.service'

/** The list of defect types a nonconformance is filed under. Staff read; admins keep the list. */
export const defectTypesRouter = secureRouter('/api/defect-types')

defectTypesRouter.get('/', { roles: STAFF }, () => listDefectTypes())

defectTypesRouter.post(
  '/',
  { roles: ADMIN, body: defectTypeSchema },
  async ({ user, body, res }) => {
    res.status(201)
    return createDefectType(user, body)
  },
)

// Written out rather than defectTypeSchema.partial(): zod 4 would fill in active: true.
const updateDefectTypeSchema = z.object({
  code: defectTypeSchema.shape.code.optional(),
  label: defectTypeSchema.shape.label.optional(),
  active: z.boolean().optional(),
})

defectTypesRouter.patch(
  '/:id',
  { roles: ADMIN, params: idParams, body: updateDefectTypeSchema },
  ({ user, params, body }) => updateDefectType(user, params.id, body),
)
