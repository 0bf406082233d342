import { secureRouter, idParams } from '../secureRouter'
import { ADMIN } from '../../../shared/api/roles'
import { createUserSchema, updateUserSchema, resetPasswordSchema } from '../../../shared/api/setup'
import { listUsers, createUser, updateUser, resetPassword } from './users.service'

/** Setup → People. Admin only: a list of people is not for every role to read. */
const r = secureRouter('/api/users')

r.get('/', { roles: ADMIN }, () => listUsers())

r.post('/', { roles: ADMIN, body: createUserSchema }, async ({ user, body, res }) => {
  res.status(201)
  return createUser(user, body)
})

r.patch(
  '/:id',
  { roles: ADMIN, params: idParams, body: updateUserSchema },
  ({ user, params, body }) => updateUser(user, params.id, body),
)

r.post(
  '/:id/reset-password',
  { roles: ADMIN, params: idParams, body: resetPasswordSchema },
  ({ user, params, body }) => resetPassword(user, params.id, body.password),
)

export const usersRouter = r
