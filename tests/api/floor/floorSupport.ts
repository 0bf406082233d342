import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { Express } from 'express'
import { CoatingSpec, Customer, Instrument, SpecVersion } from '../../../server/db/models'
import { specContentSchema, type SpecContent } from '../../../shared/spec/specContent'
import { addDays, localIsoDate } from '../../../shared/api/calibration'
import type { InstrumentKind } from '../../../shared/api/instruments'

export const MIL = 25.4 // 1 mil = 25.4 µm exactly (TRADE.md intro) [R]
export const uuid = () => randomUUID()

/**
 * An FBE spec as TRADE.md describes one: 12–20 mils, SSPC-PA 2 level 3 (§1, §4 [P]/[M]),
 * SP 10 / Sa 2½ with a 38–100 µm profile by replica tape (§4 [M]), steel ≥ 3 °C above the dew
 * point and RH ≤ 85 % (§5 [R]), spark test at 525 √T (NACE SP0490, §3 [M]), DSC ΔTg −2…+3 °C
 * (§6 [M]), X-cut 5A and knife ≥ 8 (ASTM D3359 A / D6677, §6 [R]; the limits are test choices).
 */
export const FBE_SPEC: SpecContent = specContentSchema.parse({
  coatingType: 'FBE',
  thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 12 * MIL, maxUm: 20 * MIL, pa2Level: 3 },
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 38,
    profileMaxUm: 100,
  },
  climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
  holiday: {
    required: true,
    method: 'high-voltage',
    voltageRule: 'NACE-SP0490',
    voltageTolerancePct: 5,
  },
  cure: { dsc: { minDeltaTgC: -2, maxDeltaTgC: 3 } },
  adhesion: { crossCut: { method: 'A', minGrade: 5 }, knife: { minRating: 8 } },
  sampling: { mode: 'every-part' },
})

let n = 0
export async function createCustomerAndSpec(content: SpecContent = FBE_SPEC) {
  n += 1
  const customer = await Customer.create({
    name: `Floor Test Water ${n} ${uuid().slice(0, 6)}`,
    code: `FT${n}${uuid().slice(0, 4)}`,
  })
  const spec = await CoatingSpec.create({
    code: `FT-FBE-${n}-${uuid().slice(0, 4)}`,
    title: 'Test FBE',
    customerId: null,
    currentVersion: 1,
  })
  await SpecVersion.create({
    specId: spec.id,
    version: 1,
    content,
    createdBy: null,
    lockedAt: null,
  })
  return { customer, spec }
}

export async function createInstrument(kind: InstrumentKind, dueInDays = 200) {
  n += 1
  return Instrument.create({
    kind,
    serial: `T-${kind.slice(0, 6).toUpperCase()}-${n}-${uuid().slice(0, 4)}`,
    calibratedOn: addDays(localIsoDate(), dueInDays - 365),
    calibrationDueOn: addDays(localIsoDate(), dueInDays),
  })
}

export function lotBody(customerId: number, specId: number, extra: Record<string, unknown> = {}) {
  return {
    clientId: uuid(),
    customerId,
    orderRef: `PO-${uuid().slice(0, 8)}`,
    specId,
    line: 'fbe-powder',
    shift: '1',
    coatingMaterial: 'Test FBE powder, green',
    batchNumber: 'PB-2291',
    batchExpiresOn: addDays(localIsoDate(), 90),
    ...extra,
  }
}

export function partBody(extra: Record<string, unknown> = {}) {
  return {
    clientId: uuid(),
    partNumber: 'VB-150-PN16',
    description: 'Gate valve body DN150',
    heatNumber: `H${uuid().slice(0, 6)}`,
    coatedAreaM2: 0.8,
    ...extra,
  }
}

/** Five spots of three readings in one area (a part under 100 ft² is one area: SSPC-PA 2 [R]). */
export function spotReadings(
  instrumentId: number,
  spotsUm: number[][],
  areaNo = 1,
  firstSpotNo = 1,
) {
  return spotsUm.flatMap((readings, s) =>
    readings.map((thicknessUm) => ({
      clientId: uuid(),
      areaNo,
      spotNo: firstSpotNo + s,
      thicknessUm,
      instrumentId,
    })),
  )
}

/** Every non-thickness section of a conforming FBE part. */
export function conformingSections(ids: {
  thermometer: number
  micrometer: number
  sparkTester: number
  gauge: number
}) {
  return {
    // Replica tape: 4.2 mil read − 2.0 mil backing = 2.2 mil (55.88 µm) profile, inside 38–100 µm (§4 [R] backing).
    'surface-prep': {
      instrumentId: ids.micrometer,
      data: {
        gradeRecorded: 'SSPC-SP10/Sa2.5',
        profileMethod: 'C-replica-tape',
        profileLocations: [
          { readingsUm: [4.2 * MIL] },
          { readingsUm: [4.2 * MIL] },
          { readingsUm: [4.2 * MIL] },
        ],
      },
    },
    // 20 °C / 60 % RH → dew point 12.00 °C; steel 25 °C is 13 °C above (§5 Magnus check [C]).
    climate: {
      instrumentId: ids.thermometer,
      data: { airTempC: 20, relativeHumidityPct: 60, steelTempC: 25 },
    },
    'thickness-gauge': { instrumentId: ids.gauge, data: { gaugeType: 'type-2' } },
    // 16 mils → 525 √16 = 2,100 V (NACE SP0490, §3 check [C]).
    holiday: {
      instrumentId: ids.sparkTester,
      data: {
        method: 'high-voltage',
        voltageUsedV: 2100,
        thicknessBasisUm: 16 * MIL,
        holidays: [],
      },
    },
    cure: { instrumentId: null, data: { dsc: { deltaTgC: 0.5 } } },
    adhesion: { instrumentId: null, data: { crossCut: { grade: '5A' }, knife: { rating: 9 } } },
  } as const
}

export async function recordSections(
  app: Express,
  auth: string,
  partId: number,
  sections: ReturnType<typeof conformingSections>,
) {
  for (const [section, body] of Object.entries(sections)) {
    const res = await request(app)
      .put(`/api/parts/${partId}/sections/${section}`)
      .set('Authorization', auth)
      .send({ clientId: uuid(), ...body })
    if (res.status !== 200)
      throw new Error(`section ${section}: ${res.status} ${JSON.stringify(res.body)}`)
  }
}
