import { secureRouter, idParams } from '../secureRouter'
import { ADMIN, STAFF } from '../../../shared/api/roles'
import { createInstrumentSchema, updateInstrumentSchema } from '../../../shared/api/setup'
import { createInstrument, listInstruments, updateInstrument } from './instruments.service'

/** Setup → Instruments and their calibration. Staff read (the tablet picks a gauge); admins write. */
const r = secureRouter('/api/instruments')

r.get('/', { roles: STAFF }, () => listInstruments())

r.post('/', { roles: ADMIN, body: createInstrumentSchema }, async ({ user, body, res }) => {
  res.status(201)
  return createInstrument(user, body)
})

r.patch(
  '/:id',
  { roles: ADMIN, params: idParams, body: updateInstrumentSchema },
  ({ user, params, body }) => updateInstrument(user, params.id, body),
)

export const instrumentsRouter = r
