import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { AuditEvent, GaugeReading, Part } from '../../../server/db/models'
import { evaluatePart } from '../../../shared/rules/evaluatePart'
import { assemblePartInput, partInfoFor } from '../../../shared/inspection/assemblePartInput'
import type { PartDetail } from '../../../shared/api/lots'
import {
  FBE_SPEC,
  MIL,
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

// 12–20 mils band (TRADE.md §4 [P]); level 3 spot limits 80 % / 120 % (§1 [M]) → 243.84–609.6 µm.
const GOOD_SPOTS_UM = [
  [390, 400, 410],
  [395, 405, 400],
  [410, 420, 400],
  [380, 390, 400],
  [400, 400, 400],
]

async function openLotWithPart(extraPart: Record<string, unknown> = {}) {
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', auth)
    .send(lotBody(customerId, specId, { parts: [partBody(extraPart)] }))
  expect(res.status).toBe(201)
  return res.body as { id: number; lotNumber: string; parts: { id: number }[] }
}

beforeAll(async () => {
  const operator = await createUser('operator')
  auth = await tokenFor(app, operator)
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

describe('a full FBE part through the API', () => {
  it('opens a lot with a readable number and the spec version locked', async () => {
    const lot = await openLotWithPart()
    // Line letter F, ISO year and week, dash, 3-digit sequence.
    expect(lot.lotNumber).toMatch(/^F\d{4}-\d{3}$/)
    const detail = await request(app).get(`/api/lots/${lot.id}`).set('Authorization', auth)
    expect(detail.body.specVersion).toBe(1)
    expect(detail.body.parts[0].verdict.status).toBe('incomplete')
    expect(detail.body.photos).toEqual([])
    const audit = await AuditEvent.findAll({ where: { lotId: lot.id } })
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(['lot.open', 'part.create']))
  })

  it('numbers lots of the same line and week one after the other, even when opened at once', async () => {
    const bodies = Array.from({ length: 6 }, () => lotBody(customerId, specId))
    const results = await Promise.all(
      bodies.map((b) => request(app).post('/api/lots').set('Authorization', auth).send(b)),
    )
    const numbers = results.map((r) => r.body.lotNumber as string)
    expect(results.every((r) => r.status === 201)).toBe(true)
    expect(new Set(numbers).size).toBe(6)
    const seqs = numbers.map((x) => Number(x.split('-')[1])).sort((a, b) => a - b)
    expect(seqs[5]! - seqs[0]!).toBe(5)
  })

  it('records every section and a complete PA 2 plan: every criterion passes', async () => {
    const lot = await openLotWithPart()
    const partId = lot.parts[0]!.id
    await recordSections(app, auth, partId, conformingSections(ids))
    const res = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send({ readings: spotReadings(ids.gauge, GOOD_SPOTS_UM) })
    expect(res.status).toBe(201)
    expect(res.body.storedCount).toBe(15)
    expect(res.body.verdict.status).toBe('pass')

    const part = (await request(app).get(`/api/parts/${partId}`).set('Authorization', auth))
      .body as PartDetail
    expect(part.verdict!.status).toBe('pass')
    expect(part.verdict!.criteria.map((c) => [c.criterion, c.status])).toEqual([
      ['surface-prep', 'pass'],
      ['climate', 'pass'],
      ['thickness', 'pass'],
      ['holiday', 'pass'],
      ['cure', 'pass'],
      ['adhesion', 'pass'],
    ])
    // 0.8 m² ≈ 8.6 ft² < 100 ft²: one area of 5 spots (SSPC-PA 2 area-count rule [R]).
    expect(part.verdict!.samplingPlan.progress).toBe('5 of 5 spots')
    expect(part.readings).toHaveLength(15)
    expect(Object.keys(part.sections).sort()).toEqual([
      'adhesion',
      'climate',
      'cure',
      'holiday',
      'surface-prep',
      'thickness-gauge',
    ])
    const stored = await Part.findByPk(partId)
    expect(stored!.verdictStatus).toBe('pass')
    expect(stored!.firstPassStatus).toBe('pass')
    expect(stored!.thicknessMeanUm).toBeCloseTo(400, 6)
    const lotDetail = await request(app).get(`/api/lots/${lot.id}`).set('Authorization', auth)
    expect(lotDetail.body.lotVerdict.status).toBe('pass')
    expect(lotDetail.body.partsPassed).toBe(1)
  })

  it('shows sampling progress while readings come in ("2 of 5 spots")', async () => {
    const lot = await openLotWithPart()
    const partId = lot.parts[0]!.id
    const res = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send({ readings: spotReadings(ids.gauge, GOOD_SPOTS_UM.slice(0, 2)) })
    expect(res.body.verdict.samplingPlan.progress).toBe('2 of 5 spots')
    expect(res.body.verdict.criteria[2].status).toBe('incomplete')
  })

  it('one spot below the level-3 restriction fails thickness and names the spot', async () => {
    const lot = await openLotWithPart()
    const partId = lot.parts[0]!.id
    await recordSections(app, auth, partId, conformingSections(ids))
    // Spot 3 mean 240 µm (9.45 mil) < 80 % × 12 mils = 9.6 mil (243.84 µm): SSPC-PA 2 level 3 [M],
    // "any spot below the restriction fails whatever the mean" (§1 worked example [C]).
    const spots = GOOD_SPOTS_UM.map((s, i) => (i === 2 ? [230, 240, 250] : s))
    const res = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send({ readings: spotReadings(ids.gauge, spots) })
    expect(res.status).toBe(201)
    const thickness = res.body.verdict.criteria.find(
      (c: { criterion: string }) => c.criterion === 'thickness',
    )
    expect(thickness.status).toBe('fail')
    expect(thickness.reason).toMatch(/Area 1, spot 3/)
    expect(thickness.reason).toMatch(/spot minimum 9\.60 mil/)
    expect(res.body.verdict.status).toBe('fail')
    expect((await Part.findByPk(partId))!.firstPassStatus).toBe('fail')
  })

  it('the server verdict equals shared/rules evaluatePart on the same rows (tablet and server agree)', async () => {
    const lot = await openLotWithPart({ coatedAreaM2: 12.5 })
    const partId = lot.parts[0]!.id
    await recordSections(app, auth, partId, conformingSections(ids))
    // 12.5 m² = 134.5 ft²: 2 areas (ceil(A/100), SSPC-PA 2 [R]); odd values straight from a gauge.
    const spots = [
      [401.3, 388.7, 412.9],
      [305.1, 333.3, 290.2],
      [455.55, 470.1, 430.05],
      [399.99, 400.01, 400],
      [612.4, 600.2, 590.7],
    ]
    const readings = [
      ...spotReadings(ids.gauge, spots, 1),
      ...spotReadings(ids.gauge, spots.slice(0, 3), 2),
    ]
    const res = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send({ readings })
    expect(res.status).toBe(201)
    const part = (await request(app).get(`/api/parts/${partId}`).set('Authorization', auth))
      .body as PartDetail
    const sectionRows = Object.values(part.sections).map((s) => ({
      section: s!.section,
      round: s!.round,
      data: s!.data,
    }))
    const readingRows = part.readings.map((r) => ({
      ...r,
      instrumentKind: 'dft-gauge-type2' as const,
    }))
    const local = evaluatePart(
      part.spec,
      partInfoFor(part),
      assemblePartInput(part.spec.thickness.rule, part.round, sectionRows, readingRows),
    )
    expect(part.verdict).toEqual(local)
    expect(local.samplingPlan.progress).toBe('8 of 10 spots')
    // Sent as numbers, stored as double precision, read back bit for bit.
    expect(part.readings.map((r) => r.thicknessUm)).toEqual(readings.map((r) => r.thicknessUm))
    expect(FBE_SPEC.thickness.minUm).toBe(12 * MIL)
  })
})

describe('refusals', () => {
  it('refuses an expired powder batch with its number and date', async () => {
    const res = await request(app)
      .post('/api/lots')
      .set('Authorization', auth)
      .send(lotBody(customerId, specId, { batchNumber: 'PB-2291', batchExpiresOn: '2024-11-12' }))
    expect(res.status).toBe(400)
    expect(res.body.error.message).toBe(
      'Powder batch PB-2291 expired on 2024-11-12: use an in-date batch',
    )
  })

  it('refuses readings from an overdue gauge, naming its serial and due date', async () => {
    const overdue = await createInstrument('dft-gauge-type2', -3)
    const lot = await openLotWithPart()
    const res = await request(app)
      .post(`/api/parts/${lot.parts[0]!.id}/readings`)
      .set('Authorization', auth)
      .send({ readings: spotReadings(overdue.id, [[400, 400, 400]]) })
    expect(res.status).toBe(409)
    expect(res.body.error.message).toContain(overdue.serial)
    expect(res.body.error.message).toContain(overdue.calibrationDueOn)
    expect(await GaugeReading.count({ where: { instrumentId: overdue.id } })).toBe(0)
  })

  it('refuses readings from an instrument that is not a DFT gauge', async () => {
    const lot = await openLotWithPart()
    const res = await request(app)
      .post(`/api/parts/${lot.parts[0]!.id}/readings`)
      .set('Authorization', auth)
      .send({ readings: spotReadings(ids.thermometer, [[400, 400, 400]]) })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('wrong_instrument_kind')
  })

  it('refuses section data that does not fit the section, naming the field', async () => {
    const lot = await openLotWithPart()
    const res = await request(app)
      .put(`/api/parts/${lot.parts[0]!.id}/sections/climate`)
      .set('Authorization', auth)
      .send({
        clientId: uuid(),
        instrumentId: null,
        data: { airTempC: 20, relativeHumidityPct: 160, steelTempC: 25 },
      })
    expect(res.status).toBe(400)
    expect(res.body.error.details[0].field).toBe('body.data.relativeHumidityPct')
  })

  it('answers a stale PATCH with 409 and the current record', async () => {
    const lot = await openLotWithPart()
    const partId = lot.parts[0]!.id
    const first = await request(app)
      .patch(`/api/parts/${partId}`)
      .set('Authorization', auth)
      .send({ version: 1, heatNumber: 'H-NEW-1' })
    expect(first.status).toBe(200)
    expect(first.body.version).toBe(2)
    const stale = await request(app)
      .patch(`/api/parts/${partId}`)
      .set('Authorization', auth)
      .send({ version: 1, heatNumber: 'H-OLD' })
    expect(stale.status).toBe(409)
    expect(stale.body.error.details.current.heatNumber).toBe('H-NEW-1')
  })
})
