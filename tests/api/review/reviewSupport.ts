import request from 'supertest'
import type { Express } from 'express'
import { createUser, tokenFor } from '../support/fixtures'
import {
  conformingSections,
  createCustomerAndSpec,
  createInstrument,
  lotBody,
  partBody,
  recordSections,
  spotReadings,
  uuid,
} from '../floor/floorSupport'
import type { User } from '../../../server/db/models'

/**
 * Lots built through the real shop-floor routes, for the review tests. The spec is the floor
 * tests' FBE spec: 12–20 mils by SSPC-PA 2 level 3 (TRADE.md §4 [P]); level-3 spot limits are
 * 80 % / 120 % of the band (§1 [M]) → spot minimum 243.84 µm, area minimum 304.8 µm.
 */
export const GOOD_SPOTS_UM = [
  [390, 400, 410],
  [395, 405, 400],
  [410, 420, 400],
  [380, 390, 400],
  [400, 400, 400],
]
/** Area mean 255 µm < 304.8 µm (12 mils): a thin-film failure, every spot above the 243.84 µm spot minimum. */
export const THIN_SPOTS_UM = [
  [250, 255, 260],
  [255, 255, 255],
  [250, 260, 255],
  [255, 250, 260],
  [255, 255, 255],
]

export interface Person {
  user: User
  auth: string
}

export interface ReviewWorld {
  operator: Person
  supervisor: Person
  supervisor2: Person
  admin: Person
  customerId: number
  specId: number
  ids: { thermometer: number; micrometer: number; sparkTester: number; gauge: number }
}

async function person(app: Express, role: 'operator' | 'supervisor' | 'admin'): Promise<Person> {
  const user = await createUser(role)
  return { user, auth: await tokenFor(app, user) }
}

export async function reviewWorld(app: Express): Promise<ReviewWorld> {
  const made = await createCustomerAndSpec()
  return {
    operator: await person(app, 'operator'),
    supervisor: await person(app, 'supervisor'),
    supervisor2: await person(app, 'supervisor'),
    admin: await person(app, 'admin'),
    customerId: made.customer.id,
    specId: made.spec.id,
    ids: {
      thermometer: (await createInstrument('surface-thermometer')).id,
      micrometer: (await createInstrument('replica-tape-micrometer')).id,
      sparkTester: (await createInstrument('holiday-high-voltage')).id,
      gauge: (await createInstrument('dft-gauge-type2')).id,
    },
  }
}

/** Records every section and 15 readings on a part, as `by` (the operator unless said). */
export async function inspectPart(
  app: Express,
  w: ReviewWorld,
  partId: number,
  spotsUm: number[][],
  by: Person = w.operator,
) {
  await recordSections(app, by.auth, partId, conformingSections(w.ids))
  const res = await request(app)
    .post(`/api/parts/${partId}/readings`)
    .set('Authorization', by.auth)
    .send({ readings: spotReadings(w.ids.gauge, spotsUm) })
  if (res.status !== 201) throw new Error(`readings: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body.verdict.status as string
}

/** Opens a lot with one part per entry and inspects each with those spots (null: left uninspected). */
export async function inspectedLot(
  app: Express,
  w: ReviewWorld,
  spots: (number[][] | null)[],
  by: Person = w.operator,
) {
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', by.auth)
    .send(
      lotBody(w.customerId, w.specId, {
        parts: spots.map((_, i) => partBody({ partNumber: `VB-${i + 1}` })),
      }),
    )
  if (res.status !== 201) throw new Error(`open lot: ${res.status} ${JSON.stringify(res.body)}`)
  const lot = res.body as { id: number; lotNumber: string; parts: { id: number }[] }
  for (const [i, s] of spots.entries()) if (s) await inspectPart(app, w, lot.parts[i]!.id, s, by)
  return { id: lot.id, lotNumber: lot.lotNumber, partIds: lot.parts.map((p) => p.id) }
}

export async function lotVersion(app: Express, w: ReviewWorld, lotId: number): Promise<number> {
  const res = await request(app).get(`/api/lots/${lotId}`).set('Authorization', w.supervisor.auth)
  return res.body.version as number
}

export function submit(app: Express, by: Person, lotId: number) {
  return request(app).post(`/api/lots/${lotId}/submit`).set('Authorization', by.auth).send({})
}

export async function decide(
  app: Express,
  w: ReviewWorld,
  by: Person,
  lotId: number,
  decision: string,
  reason = '',
) {
  const version = await lotVersion(app, w, lotId)
  return request(app)
    .post(`/api/lots/${lotId}/decisions`)
    .set('Authorization', by.auth)
    .send({ decision, reason, version })
}

/** A lot inspected and submitted, ready for a decision. */
export async function submittedLot(app: Express, w: ReviewWorld, spots: (number[][] | null)[]) {
  const lot = await inspectedLot(app, w, spots)
  const res = await submit(app, w.operator, lot.id)
  if (res.status !== 200) throw new Error(`submit: ${res.status} ${JSON.stringify(res.body)}`)
  return {
    ...lot,
    submitted: res.body as {
      nonconformancesOpened: { id: number; number: string; version: number; criterion: string }[]
    },
  }
}

export { uuid }
