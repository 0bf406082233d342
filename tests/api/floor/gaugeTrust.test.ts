import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { GaugeReading, Lot } from '../../../server/db/models'
import type { PartDetail, ReadingsBatchResult } from '../../../shared/api/lots'
import {
  conformingSections,
  createCustomerAndSpec,
  createInstrument,
  lotBody,
  partBody,
  recordSections,
  spotReadings,
  uuid,
} from './floorSupport'

const app = createApp()
let auth: string
let ids: { thermometer: number; micrometer: number; sparkTester: number; gauge: number }
let customerId: number
let specId: number
// 12–20 mils (TRADE.md §4 [P]); every spot well inside the level-3 limits (§1 [M]).
const GOOD = [
  [400, 405, 395],
  [410, 400, 390],
  [400, 400, 400],
  [420, 410, 400],
  [380, 400, 390],
]

async function newPart() {
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', auth)
    .send(lotBody(customerId, specId, { parts: [partBody()] }))
  return {
    lotId: res.body.id as number,
    lotNumber: res.body.lotNumber as string,
    partId: res.body.parts[0].id as number,
  }
}

const post = (partId: number, readings: unknown[]) =>
  request(app).post(`/api/parts/${partId}/readings`).set('Authorization', auth).send({ readings })
const verify = (instrumentId: number, readingUm: number) =>
  request(app)
    .post(`/api/instruments/${instrumentId}/verifications`)
    .set('Authorization', auth)
    // A 250 µm reference shim checked to ± 10 µm: values chosen for the test [P: shop practice].
    .send({
      clientId: uuid(),
      referenceNominalUm: 250,
      toleranceUm: 10,
      readingUm,
      occasion: 'end-of-shift',
    })

beforeAll(async () => {
  auth = await tokenFor(app, await createUser('operator'))
  const made = await createCustomerAndSpec()
  customerId = made.customer.id
  specId = made.spec.id
  ids = {
    thermometer: (await createInstrument('surface-thermometer')).id,
    micrometer: (await createInstrument('replica-tape-micrometer')).id,
    sparkTester: (await createInstrument('holiday-high-voltage')).id,
    gauge: (await createInstrument('dft-gauge-type2')).id,
  }
})

describe('shift verification', () => {
  it('passes within tolerance, on the limit included', async () => {
    const res = await verify(ids.gauge, 260)
    expect(res.status).toBe(201)
    expect(res.body.verification.passed).toBe(true)
    expect(res.body.suspectCount).toBe(0)
    const list = await request(app)
      .get(`/api/instruments/${ids.gauge}/verifications`)
      .set('Authorization', auth)
    expect(list.body[0].readingUm).toBe(260)
  })

  it('a failed check makes readings since the last good one suspect; the part cannot pass until they are discarded and re-measured', async () => {
    // SSPC-PA 2 / ASTM D7091: a gauge failing its post-measurement check makes every reading since the last good check suspect [R].
    const gauge = await createInstrument('dft-gauge-type2')
    const sections = { ...conformingSections({ ...ids, gauge: gauge.id }) }
    const { partId } = await newPart()
    await recordSections(app, auth, partId, sections)
    const before = await post(partId, spotReadings(gauge.id, GOOD.slice(0, 2)))
    expect(before.status).toBe(201)
    expect((await verify(gauge.id, 252)).body.verification.passed).toBe(true)
    const after = await post(partId, spotReadings(gauge.id, GOOD.slice(2), 1, 3))
    expect(after.body.verdict.reason).toBe('Every required criterion conforms to the spec.')

    const failed = await verify(gauge.id, 275) // 25 µm off a ± 10 µm standard
    expect(failed.status).toBe(201)
    expect(failed.body.verification.passed).toBe(false)
    expect(failed.body.suspectCount).toBe(9) // only the 9 readings after the good check
    expect(failed.body.affectedPartIds).toEqual([partId])

    let part = (await request(app).get(`/api/parts/${partId}`).set('Authorization', auth))
      .body as PartDetail
    const suspect = part.readings.filter((r) => r.suspect)
    expect(suspect.map((r) => r.spotNo).sort()).toEqual([3, 3, 3, 4, 4, 4, 5, 5, 5])
    expect(part.verdict!.status).toBe('incomplete')
    const thickness = part.verdict!.criteria.find((c) => c.criterion === 'thickness')!
    expect(thickness.reason).toMatch(/re-measure/)

    // Re-measured after a good check, but the suspect readings are still live: still not a pass.
    await verify(gauge.id, 250)
    const remeasured = await post(partId, spotReadings(gauge.id, GOOD.slice(2), 1, 3))
    expect(remeasured.body.verdict.status).toBe('incomplete')

    for (const r of suspect) {
      const d = await request(app)
        .post(`/api/readings/${r.id}/discard`)
        .set('Authorization', auth)
        .send({ reason: 'Gauge failed end-of-shift check' })
      expect(d.status).toBe(200)
      expect(d.body.reading.discarded).toBe(true)
    }
    part = (await request(app).get(`/api/parts/${partId}`).set('Authorization', auth))
      .body as PartDetail
    expect(part.verdict!.status).toBe('pass')
    // Nothing was deleted: 6 + 9 + 9 readings, 9 flagged and discarded with the reason.
    expect(part.readings).toHaveLength(24)
    expect(
      part.readings
        .filter((r) => r.discarded)
        .every((r) => r.discardReason === 'Gauge failed end-of-shift check'),
    ).toBe(true)
  })

  it('a reading arriving late from an offline tablet, taken before a failed check, is stored suspect', async () => {
    const gauge = await createInstrument('dft-gauge-type2')
    const { partId } = await newPart()
    await verify(gauge.id, 250)
    await new Promise((r) => setTimeout(r, 20))
    const takenAt = new Date().toISOString() // after the good check, before the failed one
    await new Promise((r) => setTimeout(r, 20))
    await verify(gauge.id, 300)
    const res = await post(
      partId,
      spotReadings(gauge.id, [[400, 400, 400]]).map((r) => ({ ...r, takenAt })),
    )
    expect(res.status).toBe(201)
    expect((res.body as ReadingsBatchResult).readings.every((r) => r.suspect)).toBe(true)
  })

  it('the database refuses to change a reading value or delete it', async () => {
    const { partId } = await newPart()
    await post(partId, spotReadings(ids.gauge, [[400, 400, 400]]))
    const reading = await GaugeReading.findOne({ where: { partId } })
    await expect(reading!.update({ thicknessUm: 999 })).rejects.toThrow(/evidence/)
    await expect(reading!.destroy()).rejects.toThrow(/never deleted/)
  })
})

describe('no lost work, nothing twice', () => {
  it('the same readings batch sent twice stores one of each and answers the same result', async () => {
    const { partId } = await newPart()
    const batch = spotReadings(ids.gauge, [[400, 401, 402]])
    const first = await post(partId, batch)
    const second = await post(partId, batch)
    expect(first.status).toBe(201)
    expect(second.status).toBe(200)
    expect(second.body.storedCount).toBe(0)
    expect(second.body.readings).toEqual(first.body.readings)
    expect(second.body.verdict).toEqual(first.body.verdict)
    expect(await GaugeReading.count({ where: { partId } })).toBe(3)
  })

  it('a batch replayed after the lot went on hold still answers as stored', async () => {
    const { partId, lotId } = await newPart()
    const batch = spotReadings(ids.gauge, [[400, 401, 402]])
    await post(partId, batch)
    await Lot.update({ status: 'on-hold' }, { where: { id: lotId } })
    const replay = await post(partId, batch)
    expect(replay.status).toBe(200)
    expect(replay.body.readings).toHaveLength(3)
  })

  it('refuses a clientId that already belongs to another part', async () => {
    const a = await newPart()
    const b = await newPart()
    const batch = spotReadings(ids.gauge, [[400, 401, 402]])
    await post(a.partId, batch)
    const res = await post(b.partId, batch)
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('client_id_reused')
  })

  it('answers 409 with a clear message for every write to a lot that is not open', async () => {
    const { partId, lotId, lotNumber } = await newPart()
    await Lot.update({ status: 'on-hold' }, { where: { id: lotId } })
    const readings = await post(partId, spotReadings(ids.gauge, [[400, 400, 400]]))
    expect(readings.status).toBe(409)
    expect(readings.body.error.message).toBe(
      `Lot ${lotNumber} is on hold: a supervisor must reopen it before readings are added`,
    )
    const section = await request(app)
      .put(`/api/parts/${partId}/sections/notes`)
      .set('Authorization', auth)
      .send({ clientId: uuid(), instrumentId: null, data: { text: 'late note' } })
    expect(section.status).toBe(409)
    const part = await request(app)
      .post(`/api/lots/${lotId}/parts`)
      .set('Authorization', auth)
      .send(partBody())
    expect(part.status).toBe(409)
    await Lot.update({ status: 'released' }, { where: { id: lotId } })
    const patch = await request(app)
      .patch(`/api/parts/${partId}`)
      .set('Authorization', auth)
      .send({ version: 1, heatNumber: 'X' })
    expect(patch.status).toBe(409)
    expect(patch.body.error.message).toMatch(
      /has been released: its inspection records can no longer change/,
    )
  })
})
