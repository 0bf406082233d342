import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { conformingSections, spotReadings, uuid } from '../floor/floorSupport'
import { GOOD_SPOTS_UM, THIN_SPOTS_UM, reviewWorld, submittedLot, type ReviewWorld } from './reviewSupport'

/**
 * A touch-up cannot be re-blasted or re-coated in other weather: a repair-and-retest round keeps
 * the round-1 surface prep, climate, gauge set-up, cure and adhesion records and asks again only
 * for thickness readings and the holiday test. Strip and recoat starts from nothing. [P]
 */
const app = createApp()
let w: ReviewWorld

beforeAll(async () => {
  w = await reviewWorld(app)
})

async function dispositionFirstNc(disposition: 'repair-retest' | 'strip-recoat') {
  const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
  const nc = lot.submitted.nonconformancesOpened[0]!
  const res = await request(app)
    .post(`/api/nonconformances/${nc.id}/disposition`)
    .set('Authorization', w.supervisor.auth)
    .send({ disposition, version: nc.version })
  expect(res.status).toBe(200)
  return lot.partIds[0]!
}

/** The retest an operator does after a touch-up: the holiday test and a new set of readings. */
async function retest(partId: number) {
  const holiday = conformingSections(w.ids).holiday
  const h = await request(app)
    .put(`/api/parts/${partId}/sections/holiday`)
    .set('Authorization', w.operator.auth)
    .send({ clientId: uuid(), ...holiday })
  expect(h.status).toBe(200)
  const r = await request(app)
    .post(`/api/parts/${partId}/readings`)
    .set('Authorization', w.operator.auth)
    .send({ readings: spotReadings(w.ids.gauge, GOOD_SPOTS_UM) })
  expect(r.status).toBe(201)
  return r.body.verdict as { status: string; criteria: { criterion: string; status: string }[] }
}

describe('retest rounds', () => {
  it('repair and retest carries the round-1 prep and climate: readings + holiday test suffice', async () => {
    const partId = await dispositionFirstNc('repair-retest')
    const verdict = await retest(partId)
    expect(verdict.status).toBe('pass')
    const part = await request(app).get(`/api/parts/${partId}`).set('Authorization', w.operator.auth)
    expect(part.body.round).toBe(2)
    expect(part.body.carriedSections).toContain('surface-prep')
    // The screen shows the carried record and says which round it came from.
    expect(part.body.sections['surface-prep'].round).toBe(1)
    expect(part.body.sections.holiday.round).toBe(2)
    // Only round-2 readings count: the thin round-1 spots are kept but not judged again.
    const judged = part.body.verdict.samplingPlan.readingsRecorded
    expect(judged).toBe(15)
  })

  it('strip and recoat carries nothing: prep and climate must be recorded again', async () => {
    const partId = await dispositionFirstNc('strip-recoat')
    const verdict = await retest(partId)
    expect(verdict.status).toBe('incomplete')
    const open = verdict.criteria.filter((c) => c.status === 'incomplete').map((c) => c.criterion)
    expect(open).toEqual(expect.arrayContaining(['surface-prep', 'climate']))
    const part = await request(app).get(`/api/parts/${partId}`).set('Authorization', w.operator.auth)
    expect(part.body.carriedSections).toEqual([])
    expect(part.body.sections['surface-prep']).toBeUndefined()
  })
})
