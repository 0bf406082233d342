import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { FLOOR } from '../../../shared/api/roles'
import { discardReadingSchema, readingsBodySchema } from '../../../shared/api/lots'
import { submitReadings } from './readingsCommitGroup'
import { discardReading } from './discard.service'

/** POST /api/parts/:id/readings lives here (it is the readings feature); the parts router has the rest. */
export const partReadingsRouter = secureRouter('/api/parts')

partReadingsRouter.post(
  '/:id/readings',
  { roles: FLOOR, params: idParams, body: readingsBodySchema },
  async ({ res, params, body, user }) => {
    const { result, created } = await submitReadings(user, params.id, body.readings)
    res.status(created ? 201 : 200)
    return result
  },
)

export const readingsRouter = secureRouter('/api/readings')

const readingIdParams = z.object({ id: z.string().regex(/^[1-9]\d{0,17}$/, 'Not a reading id') })

readingsRouter.post(
  '/:id/discard',
  { roles: FLOOR, params: readingIdParams, body: discardReadingSchema },
  ({ params, body, user }) => discardReading(user, params.id, body.reason),
)
