import { beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { createUser, tokenFor } from '../support/fixtures'
import {
  createCustomerAndSpec,
  createInstrument,
  lotBody,
  partBody,
  spotReadings,
} from './floorSupport'

/**
 * The readings POST sends its statements ahead without waiting (BEGIN with the lock; COMMIT with
 * the verdict and the audit event: server/db/pipelinedTransaction.ts). What an operator and an
 * auditor rely on must still hold [P]: a batch is stored whole with its verdict and its audit
 * event, or not at all; a failed batch leaves no connection stuck in a broken transaction; and
 * batches sent at once to one part all count in its verdict.
 */
const app = createApp()
let auth: string
let gaugeId: number
let customerId: number
let specId: number

async function openPart(): Promise<number> {
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', auth)
    .send(lotBody(customerId, specId, { parts: [partBody()] }))
  expect(res.status).toBe(201)
  return (res.body as { parts: { id: number }[] }).parts[0]!.id
}

async function storedOf(partId: number) {
  const [row] = await sequelize.query<{ readings: string; audits: string; recorded: number }>(
    `SELECT (SELECT count(*) FROM gauge_readings WHERE part_id = $1) AS readings,
            (SELECT count(*) FROM audit_events
              WHERE entity_type = 'part' AND entity_id = $1::text AND action = 'readings.record') AS audits,
            (SELECT (c->'numbers'->>'readingsRecorded')::int
               FROM parts, jsonb_array_elements(verdict->'criteria') c
              WHERE id = $1 AND c->>'criterion' = 'thickness') AS recorded`,
    { bind: [partId], type: QueryTypes.SELECT },
  )
  return { readings: Number(row!.readings), audits: Number(row!.audits), recorded: row!.recorded }
}

type Answer = { verdict: { criteria: { criterion: string; numbers: Record<string, unknown> }[] } }
const thicknessOf = (body: Answer) =>
  body.verdict.criteria.find((c) => c.criterion === 'thickness')!

const post = (partId: number, spots: number[][]) =>
  request(app)
    .post(`/api/parts/${partId}/readings`)
    .set('Authorization', auth)
    .send({ readings: spotReadings(gaugeId, spots) })

/** Makes one statement of the last round trip fail, for one part only, while `run` runs. */
async function withFailing(
  table: 'audit_events' | 'parts',
  partId: number,
  run: () => Promise<void>,
) {
  const condition =
    table === 'audit_events'
      ? `NEW.entity_id = '${partId}'`
      : `NEW.id = ${partId} AND NEW.verdict IS DISTINCT FROM OLD.verdict`
  await sequelize.query(`
    CREATE FUNCTION test_refuse() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN IF ${condition} THEN RAISE EXCEPTION 'refused by the test'; END IF; RETURN NEW; END $$;
    CREATE TRIGGER test_refuse BEFORE ${table === 'parts' ? 'UPDATE' : 'INSERT'} ON ${table}
      FOR EACH ROW EXECUTE FUNCTION test_refuse();`)
  try {
    await run()
  } finally {
    await sequelize.query(`DROP TRIGGER test_refuse ON ${table}; DROP FUNCTION test_refuse();`)
  }
}

beforeAll(async () => {
  auth = await tokenFor(app, await createUser('operator'))
  const made = await createCustomerAndSpec()
  customerId = made.customer.id
  specId = made.spec.id
  gaugeId = (await createInstrument('dft-gauge-type2')).id
})

describe('a readings batch is stored whole or not at all', () => {
  for (const table of ['audit_events', 'parts'] as const) {
    it(`when the ${table === 'parts' ? 'verdict update' : 'audit event'} fails, nothing of the batch is kept`, async () => {
      const partId = await openPart()
      await withFailing(table, partId, async () => {
        const res = await post(partId, [[400, 410, 405]])
        expect(res.status).toBeGreaterThanOrEqual(500)
        expect(res.body.error.message).not.toMatch(/refused by the test/) // no internals leak
      })
      expect(await storedOf(partId)).toEqual({ readings: 0, audits: 0, recorded: 0 })
      // Every pooled connection is usable again: more requests than the pool has connections.
      for (let i = 0; i < 12; i++) expect((await post(partId, [[400, 400, 400]])).status).toBe(201)
      expect(await storedOf(partId)).toEqual({ readings: 36, audits: 12, recorded: 36 })
    })
  }

  it('batches sent at once to one part are all stored and all counted in its verdict', async () => {
    const partId = await openPart()
    const answers = await Promise.all(
      Array.from({ length: 10 }, () => post(partId, [[390, 400, 410]])),
    )
    expect(answers.map((a) => a.status)).toEqual(Array(10).fill(201))
    expect(await storedOf(partId)).toEqual({ readings: 30, audits: 10, recorded: 30 })
    // the answers saw the part grow one batch at a time, each seeing all before it
    const seen = answers
      .map((a) => thicknessOf(a.body).numbers.readingsRecorded as number)
      .sort((a, b) => a - b)
    expect(seen).toEqual([3, 6, 9, 12, 15, 18, 21, 24, 27, 30])
  })

  it('a resent batch is answered as stored and stores nothing twice', async () => {
    const partId = await openPart()
    const body = { readings: spotReadings(gaugeId, [[400, 401, 402]]) }
    const first = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send(body)
    const again = await request(app)
      .post(`/api/parts/${partId}/readings`)
      .set('Authorization', auth)
      .send(body)
    expect([first.status, again.status]).toEqual([201, 200])
    expect(again.body.readings.map((r: { id: string }) => r.id)).toEqual(
      first.body.readings.map((r: { id: string }) => r.id),
    )
    expect(await storedOf(partId)).toEqual({ readings: 3, audits: 1, recorded: 3 })
  })
})
