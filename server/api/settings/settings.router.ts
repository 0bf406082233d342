import { secureRouter } from '../secureRouter'
import { ADMIN, STAFF } from '../../../shared/api/roles'
import { settingsSchema } from '../../../shared/api/setup'
import { getPlantSettings, updatePlantSettings } from './settings.service'

/** Setup → Plant settings. Staff read them (the review screen needs them); admins change them. */
const r = secureRouter('/api/settings')

r.get('/', { roles: STAFF }, () => getPlantSettings())

r.put('/', { roles: ADMIN, body: settingsSchema }, ({ user, body }) =>
  updatePlantSettings(user, body),
)

export const settingsRouter = r
