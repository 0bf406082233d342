import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { runSeed } from '../../../server/db/seeders'
import { createUser, tokenFor } from '../support/fixtures'
import { evaluatePart } from '../../../shared/rules/evaluatePart'
import { assemblePartInput, partInfoFor } from '../../../shared/inspection/assemblePartInput'
import type { LotDetail, LotRow, PartDetail } from '../../../shared/api/lots'

const app = createApp()
let auth: string
let seconds: number

const q = <T extends object>(sql: string) => sequelize.query<T>(sql, { type: QueryTypes.SELECT })

beforeAll(async () => {
  const started = Date.now()
  await runSeed()
  seconds = (Date.now() - started) / 1000
  auth = await tokenFor(app, await createUser('supervisor'))
}, 60000)

describe('demo shop-floor history', () => {
  it('seeds months of lots on both lines and three shifts', async () => {
    console.info(`floor history seeded in ${seconds.toFixed(1)} s`)
    // The seed time is printed for the record; speed targets live in the benchmark, not here.
    const [span] = await q<{
      days: number
      lines: number
      shifts: number
      lots: number
      readings: number
    }>(
      `SELECT (max(created_at)::date - min(created_at)::date) AS days, count(DISTINCT line)::int AS lines,
              count(DISTINCT shift)::int AS shifts, count(*)::int AS lots,
              (SELECT count(*)::int FROM gauge_readings) AS readings FROM lots`,
    )
    expect(span!.days).toBeGreaterThanOrEqual(100)
    expect(span!.lines).toBe(2)
    expect(span!.shifts).toBe(3)
    expect(span!.lots).toBeGreaterThan(100)
    expect(span!.readings).toBeGreaterThan(3000)
  })

  it('has rejects that were repaired (first pass failed, final pass) and released lots that all conform', async () => {
    const [yieldRow] = await q<{ firstFail: number; repaired: number; releasedFailing: number }>(
      `SELECT count(*) FILTER (WHERE first_pass_status = 'fail' AND l.status = 'released')::int AS "firstFail",
              count(*) FILTER (WHERE first_pass_status = 'fail' AND verdict_status = 'pass' AND round > 1)::int AS repaired,
              (SELECT count(*)::int FROM parts p JOIN lots l ON l.id = p.lot_id
                WHERE l.status = 'released' AND p.sampled AND p.verdict_status <> 'pass') AS "releasedFailing"
         FROM parts JOIN lots l ON l.id = parts.lot_id`,
    )
    expect(yieldRow!.firstFail).toBeGreaterThan(5)
    expect(yieldRow!.repaired).toBe(yieldRow!.firstFail)
    expect(yieldRow!.releasedFailing).toBe(0)
    const [holidays] = await q<{ n: number }>(
      `SELECT count(*)::int AS n FROM section_records WHERE section = 'holiday' AND data->'holidays' @> '[{"found": true, "repaired": true}]'`,
    )
    expect(holidays!.n).toBeGreaterThan(0)
  })

  it('leaves a lot awaiting review with a failing part, and open lots for the operator', async () => {
    const review = (
      await request(app)
        .get('/api/lots')
        .query({ status: 'awaiting-review' })
        .set('Authorization', auth)
    ).body as LotRow[]
    expect(review.some((l) => l.partsFailed > 0)).toBe(true)
    const open = (
      await request(app).get('/api/lots').query({ status: 'open' }).set('Authorization', auth)
    ).body as LotRow[]
    expect(open.length).toBeGreaterThanOrEqual(2)
    const failing = review.find((l) => l.partsFailed > 0)!
    const detail = (await request(app).get(`/api/lots/${failing.id}`).set('Authorization', auth))
      .body as LotDetail
    expect(detail.lotVerdict.status).toBe('fail')
  })

  it('stored verdicts are what the shared rules compute from the stored rows', async () => {
    const sample = await q<{ id: number }>(
      `SELECT id FROM parts WHERE sampled ORDER BY id LIMIT 40`,
    )
    for (const { id } of sample) {
      const part = (await request(app).get(`/api/parts/${id}`).set('Authorization', auth))
        .body as PartDetail
      const sections = Object.values(part.sections).map((s) => ({
        section: s!.section,
        round: s!.round,
        data: s!.data,
      }))
      const readings = part.readings.map((r) => ({
        ...r,
        instrumentKind: 'dft-gauge-type2' as const,
      }))
      const local = evaluatePart(
        part.spec,
        partInfoFor(part),
        assemblePartInput(part.spec.thickness.rule, part.round, sections, readings),
      )
      expect(part.verdict).toEqual(local)
    }
  })

  it('runs once: a second seed adds no history', async () => {
    const [before] = await q<{ n: number }>('SELECT count(*)::int AS n FROM lots')
    const summary = await runSeed()
    expect(summary.skipped).toContain('floor-history')
    const [after] = await q<{ n: number }>('SELECT count(*)::int AS n FROM lots')
    expect(after!.n).toBe(before!.n)
  })
})
