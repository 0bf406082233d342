import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, STAFF } from '../../../shared/api/roles'
import { SECTIONS, sectionBodySchema, updatePartSchema } from '../../../shared/api/lots'
import { updatePart } from './parts.service'
import { getPartDetail } from './partDetail'
import { recordSection } from './sections.service'

export const partsRouter = secureRouter('/api/parts')

partsRouter.get('/:id', { roles: STAFF, params: idParams }, ({ params }) =>
  getPartDetail(params.id),
)

partsRouter.patch(
  '/:id',
  { roles: FLOOR, params: idParams, body: updatePartSchema },
  ({ params, body, user }) => updatePart(user, params.id, body),
)

const sectionParams = idParams.extend({ section: z.enum(SECTIONS) })

partsRouter.put(
  '/:id/sections/:section',
  { roles: FLOOR, params: sectionParams, body: sectionBodySchema },
  ({ params, body, user }) => recordSection(user, params.id, params.section, body),
)
