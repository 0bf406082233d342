import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { DEFAULT_SETTINGS } from '../../../shared/api/setup'
import { auditFor, fieldsOf } from './setupFixtures'

const app = createApp()

describe('Setup → Plant settings', () => {
  let admin: string
  let supervisor: string
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
    supervisor = await tokenFor(app, await createUser('supervisor'))
  })

  it('answers the defaults before anything was saved, then what an admin saved, with an audit of the change', async () => {
    const first = await request(app).get('/api/settings').set('Authorization', supervisor)
    expect(first.status).toBe(200)
    expect(first.body).toEqual(DEFAULT_SETTINGS)

    const wanted = {
      allowRecorderToRelease: true,
      plantName: 'Test Coating Shop',
      plantAddress: '1 Test Lane',
    }
    const saved = await request(app)
      .put('/api/settings')
      .set('Authorization', admin)
      .send({ ...wanted, sneaky: 'ignored' })
    expect(saved.status).toBe(200)
    expect(saved.body).toEqual(wanted)
    expect((await request(app).get('/api/settings').set('Authorization', supervisor)).body).toEqual(
      wanted,
    )

    const [event] = await auditFor('setting', 'plant')
    expect(event).toMatchObject({
      action: 'settings.update',
      before: DEFAULT_SETTINGS,
      after: wanted,
    })
  })

  it('names the missing or wrong field (400) and keeps what was saved', async () => {
    const before = (await request(app).get('/api/settings').set('Authorization', admin)).body
    const res = await request(app)
      .put('/api/settings')
      .set('Authorization', admin)
      .send({ allowRecorderToRelease: 'yes', plantName: '' })
    expect(res.status).toBe(400)
    expect(fieldsOf(res.body)).toEqual(
      expect.arrayContaining([
        'body.allowRecorderToRelease',
        'body.plantName',
        'body.plantAddress',
      ]),
    )
    expect((await request(app).get('/api/settings').set('Authorization', admin)).body).toEqual(
      before,
    )
  })
})
