import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { assertInstrumentUsable } from '../../../server/api/instruments/instruments.service'
import { addDays, localIsoDate } from '../../../shared/api/calibration'
import { CALIBRATION_WARNING_DAYS } from '../../../shared/api/instruments'
import { auditFor, fieldsOf } from './setupFixtures'

const app = createApp()
const today = localIsoDate()

describe('Setup → Instruments and calibration', () => {
  let admin: string
  let operator: string
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
    operator = await tokenFor(app, await createUser('operator'))
  })

  async function register(serial: string, dueInDays: number, kind = 'dft-gauge-type2') {
    const res = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({
        kind,
        serial,
        calibratedOn: addDays(today, dueInDays - 365),
        calibrationDueOn: addDays(today, dueInDays),
      })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    return res.body as { id: number; serial: string }
  }

  it('classifies the list against today: current, due soon within 30 days (due date included), overdue after it', async () => {
    // CALIBRATION_WARNING_DAYS = 30 is our own setting (shared/api/instruments.ts), not a standard's.
    expect(CALIBRATION_WARNING_DAYS).toBe(30)
    const cases: [string, number, string][] = [
      ['CL-31', 31, 'current'],
      ['CL-30', 30, 'due-soon'],
      ['CL-10', 10, 'due-soon'],
      ['CL-00', 0, 'due-soon'],
      ['CL-M1', -1, 'overdue'],
      ['CL-M40', -40, 'overdue'],
    ]
    for (const [serial, days] of cases) await register(serial, days)
    const list = await request(app).get('/api/instruments').set('Authorization', operator)
    expect(list.status).toBe(200)
    for (const [serial, days, status] of cases) {
      const row = list.body.find((i: { serial: string }) => i.serial === serial)
      expect(row, serial).toMatchObject({
        calibrationStatus: status,
        daysUntilDue: days,
        calibrationDueOn: addDays(today, days),
      })
    }
  })

  it('refuses a duplicate serial (409), a due date before the calibration date and an impossible date (400)', async () => {
    await register('DUP-SN-1', 100)
    const dup = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({ kind: 'hygrometer', serial: 'DUP-SN-1', calibrationDueOn: '2099-01-01' })
    expect(dup.status).toBe(409)
    expect(dup.body.error.message).toContain('DUP-SN-1')
    const backwards = await request(app).post('/api/instruments').set('Authorization', admin).send({
      kind: 'hygrometer',
      serial: 'BW-1',
      calibratedOn: '2026-06-01',
      calibrationDueOn: '2026-05-01',
    })
    expect(backwards.status).toBe(400)
    expect(fieldsOf(backwards.body)).toContain('body.calibrationDueOn')
    const impossible = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({ kind: 'hygrometer', serial: 'IM-1', calibrationDueOn: '2026-02-30' })
    expect(impossible.status).toBe(400)
    expect(fieldsOf(impossible.body)).toContain('body.calibrationDueOn')
    const month13 = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({ kind: 'hygrometer', serial: 'IM-2', calibrationDueOn: '2026-13-01' })
    expect(month13.status).toBe(400)
    const badKind = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({ kind: 'ruler', serial: 'K-1', calibrationDueOn: '2099-01-01' })
    expect(fieldsOf(badKind.body)).toContain('body.kind')
  })

  it('records a new calibration with a PATCH that keeps the fields it does not name, and audits it', async () => {
    const created = await request(app)
      .post('/api/instruments')
      .set('Authorization', admin)
      .send({
        kind: 'profile-gauge',
        serial: 'RECAL-1',
        description: 'Depth micrometer',
        certificateRef: 'C-1',
        calibrationDueOn: addDays(today, -3),
      })
    const res = await request(app)
      .patch(`/api/instruments/${created.body.id}`)
      .set('Authorization', admin)
      .send({ calibratedOn: today, calibrationDueOn: addDays(today, 365) })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      description: 'Depth micrometer',
      certificateRef: 'C-1',
      calibrationStatus: 'current',
      daysUntilDue: 365,
    })
    const last = (await auditFor('instrument', created.body.id)).at(-1)!
    expect(last).toMatchObject({
      action: 'instrument.update',
      before: { calibrationDueOn: addDays(today, -3) },
      after: { calibrationDueOn: addDays(today, 365) },
    })
  })

  it('assertInstrumentUsable: refuses an overdue gauge naming its serial and since when, and a wrong kind', async () => {
    const overdue = await register('DFT-OVERDUE-7', -5)
    const err = await assertInstrumentUsable(
      overdue.id,
      ['dft-gauge-type1', 'dft-gauge-type2'],
      new Date(),
    ).catch((e: unknown) => e)
    expect(err).toMatchObject({ status: 409, code: 'calibration_overdue' })
    const message = (err as Error).message
    expect(message).toContain('DFT-OVERDUE-7')
    // Due date = last valid day, so overdue since the day after it.
    expect(message).toContain(`overdue since ${addDays(today, -4)}`)

    // A reading dated while the calibration was still valid is fine, the due date itself included.
    await expect(
      assertInstrumentUsable(overdue.id, ['dft-gauge-type2'], addDays(today, -5)),
    ).resolves.toMatchObject({ serial: 'DFT-OVERDUE-7' })
    await expect(
      assertInstrumentUsable(overdue.id, ['dft-gauge-type2'], addDays(today, -4)),
    ).rejects.toMatchObject({ status: 409 })

    const thermometer = await register('STH-1', 100, 'surface-thermometer')
    await expect(
      assertInstrumentUsable(thermometer.id, ['dft-gauge-type2'], today),
    ).rejects.toMatchObject({
      status: 400,
      code: 'wrong_instrument_kind',
      message: expect.stringContaining('STH-1'),
    })
    await expect(
      assertInstrumentUsable(thermometer.id, ['surface-thermometer'], today),
    ).resolves.toBeTruthy()
    await expect(
      assertInstrumentUsable(999999, ['surface-thermometer'], today),
    ).rejects.toMatchObject({ status: 400, details: [{ field: 'body.instrumentId' }] })

    await request(app)
      .patch(`/api/instruments/${thermometer.id}`)
      .set('Authorization', admin)
      .send({ active: false })
    await expect(
      assertInstrumentUsable(thermometer.id, ['surface-thermometer'], today),
    ).rejects.toMatchObject({
      status: 409,
      code: 'instrument_retired',
    })
  })
})
