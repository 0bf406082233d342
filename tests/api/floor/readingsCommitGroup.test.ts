import { beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import {
  commitGroupStats,
  submitReadings,
  type ReadingsOutcome,
} from '../../../server/api/readings/readingsCommitGroup'
import type { Recorder } from '../../../server/api/readings/readings.service'
import { HttpError } from '../../../server/lib/httpError'
import { createUser, tokenFor } from '../support/fixtures'
import {
  createCustomerAndSpec,
  createInstrument,
  lotBody,
  partBody,
  spotReadings,
} from './floorSupport'

/**
 * Readings POSTs that arrive while others are being stored share one transaction (group commit,
 * server/api/readings/readingsCommitGroup.ts). What the operator and the auditor see must not
 * change [P]: each POST gets the answer, verdict and audit event it would get alone; one POST that
 * cannot be stored neither blocks nor spoils the others; a group that fails stores nothing of it.
 * The POSTs here are submitted in one tick, so the two first run alone (the groups in flight)
 * and the rest wait and form a group: deterministic, no timing luck.
 */
const app = createApp()
let actor: Recorder
let auth: string
let gaugeId: number
let customerId: number
let specId: number

beforeAll(async () => {
  const user = await createUser('operator')
  actor = { id: user.id, email: user.email, name: user.name }
  auth = await tokenFor(app, user)
  const made = await createCustomerAndSpec()
  customerId = made.customer.id
  specId = made.spec.id
  gaugeId = (await createInstrument('dft-gauge-type2')).id
})

async function openParts(count: number): Promise<number[]> {
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', auth)
    .send(lotBody(customerId, specId, { parts: Array.from({ length: count }, () => partBody()) }))
  expect(res.status).toBe(201)
  return (res.body as { parts: { id: number }[] }).parts.map((p) => p.id)
}

async function storedOf(partId: number) {
  const [row] = await sequelize.query<{
    readings: string
    audits: string
    status: string
    mean_um: number | null
  }>(
    `SELECT (SELECT count(*) FROM gauge_readings WHERE part_id = $1) AS readings,
            (SELECT count(*) FROM audit_events
              WHERE entity_type = 'part' AND entity_id = $1::text AND action = 'readings.record') AS audits,
            (SELECT verdict_status FROM parts WHERE id = $1) AS status,
            (SELECT thickness_mean_um FROM parts WHERE id = $1) AS mean_um`,
    { bind: [partId], type: QueryTypes.SELECT },
  )
  return {
    readings: Number(row!.readings),
    audits: Number(row!.audits),
    status: row!.status,
    meanUm: row!.mean_um,
  }
}

type Settled = { ok: true; value: ReadingsOutcome } | { ok: false; status: number; code: string }
/** Submits every POST in the same tick; each one's outcome, or its error's status and code. */
async function submitTogether(posts: { partId: number; readings: unknown[] }[]) {
  const settled = await Promise.allSettled(
    posts.map((p) => submitReadings(actor, p.partId, p.readings as never)),
  )
  return settled.map((s): Settled => {
    if (s.status === 'fulfilled') return { ok: true, value: s.value }
    if (s.reason instanceof HttpError)
      return { ok: false, status: s.reason.status, code: s.reason.code }
    return { ok: false, status: 500, code: String((s.reason as Error).name) }
  })
}

/**
 * One SSPC-PA 2 spot (three gauge readings [R]). The values, 400–430 µm (15.7–16.9 mil), are
 * invented test data inside FBE_SPEC's 12–20 mil band (floorSupport.ts; TRADE.md §1 [P]); the
 * assertions compare each POST with its own values, not with a band verdict.
 */
const spot = (um: number[]) => spotReadings(gaugeId, [um])

describe('readings POSTs of several parts stored in one transaction', () => {
  it('each POST of a group gets its own readings, verdict and audit event', async () => {
    const parts = await openParts(10)
    const before = { ...commitGroupStats }
    const sent = parts.map((partId, i) => ({ partId, readings: spot([400 + i, 401 + i, 402 + i]) }))
    const outcomes = await submitTogether(sent)
    // the two first ran alone; the eight others waited and were stored together
    expect(commitGroupStats.groups - before.groups).toBe(1)
    expect(commitGroupStats.groupedPosts - before.groupedPosts).toBe(8)
    expect(commitGroupStats.fallbacks - before.fallbacks).toBe(0)
    outcomes.forEach((o, i) => {
      expect(o.ok).toBe(true)
      const { result, created } = (o as { value: ReadingsOutcome }).value
      expect(created).toBe(true)
      expect(result.partId).toBe(parts[i])
      expect(result.storedCount).toBe(3)
      expect(result.readings.map((r) => r.thicknessUm)).toEqual([400 + i, 401 + i, 402 + i])
      expect(result.readings.map((r) => r.clientId)).toEqual(
        sent[i]!.readings.map((r) => r.clientId),
      )
      expect(result.readings.every((r) => /^\d+$/.test(r.id) && r.instrumentSerial)).toBe(true)
      const thickness = result.verdict.criteria.find((c) => c.criterion === 'thickness')!
      expect(thickness.numbers.readingsRecorded).toBe(3) // this part's readings, not the group's
      expect(thickness.numbers.meanUm).toBeCloseTo(401 + i, 9)
    })
    for (const [i, partId] of parts.entries())
      expect(await storedOf(partId)).toMatchObject({ readings: 3, audits: 1, meanUm: 401 + i })
  })

  it('a POST refused before anything is written gets its own error; the group is stored', async () => {
    const [held] = await openParts(1)
    await sequelize.query(
      `UPDATE lots SET status = 'on-hold' WHERE id = (SELECT lot_id FROM parts WHERE id = $1)`,
      { bind: [held] },
    )
    const [other, ...fresh] = await openParts(5)
    const before = { ...commitGroupStats }
    const outcomes = await submitTogether([
      { partId: fresh[0]!, readings: spot([400, 400, 400]) }, // alone
      { partId: fresh[1]!, readings: spot([400, 400, 400]) }, // alone
      { partId: fresh[2]!, readings: spot([410, 410, 410]) },
      { partId: held!, readings: spot([400, 400, 400]) }, // its lot is on hold
      { partId: 2_000_000_000, readings: spot([400, 400, 400]) }, // no such part
      { partId: other!, readings: spotReadings(2_000_000_000, [[400, 400, 400]]) }, // no such gauge
      { partId: fresh[3]!, readings: spot([420, 420, 420]) },
    ])
    expect(outcomes.map((o) => (o.ok ? 'stored' : `${o.status} ${o.code}`))).toEqual([
      'stored',
      'stored',
      'stored',
      '409 lot_not_open',
      '404 not_found',
      '400 invalid_reference',
      'stored',
    ])
    expect(commitGroupStats.groupedPosts - before.groupedPosts).toBe(2) // fresh[2] and fresh[3]
    expect(commitGroupStats.fallbacks - before.fallbacks).toBe(0)
    for (const partId of fresh)
      expect(await storedOf(partId)).toMatchObject({ readings: 3, audits: 1 })
    for (const partId of [held!, other!])
      expect(await storedOf(partId)).toMatchObject({ readings: 0, audits: 0 })
  })

  it('a resent POST or a clientId of another part sends the whole group back to run alone', async () => {
    const [a, b, c, d, e, f] = await openParts(6)
    const resent = spot([400, 401, 402])
    expect((await submitReadings(actor, e!, resent as never)).created).toBe(true)
    const reused = [...spot([430, 430]), { ...spot([430])[0]!, clientId: resent[0]!.clientId }]
    const before = { ...commitGroupStats }
    const outcomes = await submitTogether([
      { partId: a!, readings: spot([400, 400, 400]) }, // alone
      { partId: b!, readings: spot([400, 400, 400]) }, // alone
      { partId: c!, readings: spot([410, 410, 410]) },
      { partId: e!, readings: resent }, // its answer was lost: the same batch again
      { partId: f!, readings: reused }, // one clientId belongs to a reading of part e
      { partId: d!, readings: spot([420, 420, 420]) },
    ])
    expect(commitGroupStats.fallbacks - before.fallbacks).toBe(1)
    expect(commitGroupStats.groupedPosts - before.groupedPosts).toBe(0)
    expect(outcomes.map((o) => (o.ok ? `stored ${o.value.result.storedCount}` : o.code))).toEqual([
      'stored 3',
      'stored 3',
      'stored 3',
      'stored 0',
      'client_id_reused',
      'stored 3',
    ])
    const replay = (outcomes[3] as { value: ReadingsOutcome }).value
    expect(replay.created).toBe(false)
    for (const partId of [a!, b!, c!, d!, e!])
      expect(await storedOf(partId)).toMatchObject({ readings: 3, audits: 1 })
    expect(await storedOf(f!)).toMatchObject({ readings: 0, audits: 0 }) // nothing of it stored
  })

  it('a statement of the group that fails rolls it back; each POST then runs alone', async () => {
    const [a, b, c, refused, d] = await openParts(5)
    await sequelize.query(`
      CREATE FUNCTION test_refuse_group() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.entity_id = '${refused}' THEN RAISE EXCEPTION 'refused by the test'; END IF;
      RETURN NEW; END $$;
      CREATE TRIGGER test_refuse_group BEFORE INSERT ON audit_events
        FOR EACH ROW EXECUTE FUNCTION test_refuse_group();`)
    let outcomes: Settled[]
    const before = { ...commitGroupStats }
    try {
      outcomes = await submitTogether(
        [a, b, c, refused, d].map((partId) => ({
          partId: partId!,
          readings: spot([400, 400, 400]),
        })),
      )
    } finally {
      await sequelize.query(
        'DROP TRIGGER test_refuse_group ON audit_events; DROP FUNCTION test_refuse_group();',
      )
    }
    expect(commitGroupStats.fallbacks - before.fallbacks).toBe(1)
    expect(outcomes.map((o) => o.ok)).toEqual([true, true, true, false, true])
    for (const partId of [a!, b!, c!, d!])
      expect(await storedOf(partId)).toMatchObject({ readings: 3, audits: 1 })
    expect(await storedOf(refused!)).toMatchObject({ readings: 0, audits: 0, status: 'incomplete' })
  })

  it('through HTTP, 30 POSTs at once to 30 parts are each acknowledged and stored once', async () => {
    const parts = await openParts(30)
    const answers = await Promise.all(
      parts.map((partId) =>
        request(app)
          .post(`/api/parts/${partId}/readings`)
          .set('Authorization', auth)
          .send({ readings: spot([400, 405, 410]) }),
      ),
    )
    expect(answers.map((r) => r.status)).toEqual(Array(30).fill(201))
    answers.forEach((r, i) => expect(r.body.partId).toBe(parts[i]))
    for (const partId of parts)
      expect(await storedOf(partId)).toMatchObject({ readings: 3, audits: 1 })
  })
})
