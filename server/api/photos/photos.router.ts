import { idParams, secureRouter } from '../secureRouter'
import { FLOOR, STAFF } from '../../../shared/api/roles'
import { sendPhoto, uploadPhoto } from './photos.service'

/** Photos: uploads under their part or lot, bytes under /api/photos. */
export const photosRouter = secureRouter('/api')

photosRouter.post(
  '/parts/:id/photos',
  { roles: FLOOR, params: idParams },
  async ({ req, res, params, user }) => {
    const { photo, created } = await uploadPhoto(user, { partId: params.id }, req, res)
    res.status(created ? 201 : 200)
    return photo
  },
)

photosRouter.post(
  '/lots/:id/photos',
  { roles: FLOOR, params: idParams },
  async ({ req, res, params, user }) => {
    const { photo, created } = await uploadPhoto(user, { lotId: params.id }, req, res)
    res.status(created ? 201 : 200)
    return photo
  },
)

photosRouter.get('/photos/:id', { roles: STAFF, params: idParams }, ({ res, params }) =>
  sendPhoto(params.id, 'data', res),
)
photosRouter.get('/photos/:id/thumb', { roles: STAFF, params: idParams }, ({ res, params }) =>
  sendPhoto(params.id, 'thumb', res),
)
