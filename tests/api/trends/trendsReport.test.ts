import { beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { buildHistory, PERIOD } from './trendsHistory'
import type { TrendsReport } from '../../../shared/api/trends'

const app = createApp()
let auth = ''
let ids: Awaited<ReturnType<typeof buildHistory>>

async function report(query: string): Promise<TrendsReport> {
  const res = await request(app).get(`/api/trends?${query}`).set('Authorization', auth)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body as TrendsReport
}

beforeAll(async () => {
  ids = await buildHistory()
  auth = await tokenFor(app, await createUser('manager'))
})

describe('Line health: weekly figures on a hand-made history', () => {
  it('counts first-pass yield per ISO week with the counts behind each point', async () => {
    const r = await report(PERIOD)
    // W10: L1 has 10 parts, one failed (the 390 with an open holiday): 9 / 10 = 90 %.
    // W11: L2 7 parts (4 pass, 1 incomplete, 2 fail) + L3 3 passes; the unsampled part is not
    // counted: 7 / 10 = 70 %. The L4 part (2026-02-02) is outside the period.
    expect(r.yieldByWeek).toEqual([
      {
        weekStart: '2026-03-02',
        weekLabel: '2026-W10',
        inspected: 10,
        passed: 9,
        failed: 1,
        incomplete: 0,
        yieldPct: 90,
      },
      {
        weekStart: '2026-03-09',
        weekLabel: '2026-W11',
        inspected: 10,
        passed: 7,
        failed: 2,
        incomplete: 1,
        yieldPct: 70,
      },
    ])
    // 16 of 20 = 80 %.
    expect(r.totals).toMatchObject({ inspected: 20, passed: 16, yieldPct: 80 })
  })

  it('ranks reject causes with their cumulative share (one count per part and cause)', async () => {
    const r = await report(PERIOD)
    // NCs: thin film on two parts (the 290 of L2 and the 330 of L1), open holiday on the 390,
    // handling damage on the 400. The 505 failed without an NC: its verdict's failing
    // criterion (thickness) is the cause. The 390 has an NC, so its verdict is not counted again.
    // 5 counts: 2/5 = 40 %, then three of 1 (20 % each) in name order: 60, 80, 100 %.
    expect(r.pareto).toEqual([
      {
        cause: 'Film below minimum DFT',
        source: 'nonconformance',
        count: 2,
        pct: 40,
        cumulativePct: 40,
      },
      {
        cause: 'Film thickness (verdict)',
        source: 'verdict',
        count: 1,
        pct: 20,
        cumulativePct: 60,
      },
      { cause: 'Handling damage', source: 'nonconformance', count: 1, pct: 20, cumulativePct: 80 },
      {
        cause: 'Holiday not repaired',
        source: 'nonconformance',
        count: 1,
        pct: 20,
        cumulativePct: 100,
      },
    ])
  })

  it('counts holidays per 100 parts from the newest round-1 record of each part', async () => {
    const r = await report(PERIOD)
    // W10: 10 parts tested, 2 + 1 found (an entry with found: false does not count) = 30 per 100.
    // W11: only L2's first part was tested; its newer record says 1 (the older said 3) = 100.
    expect(r.holidaysByWeek).toEqual([
      {
        weekStart: '2026-03-02',
        weekLabel: '2026-W10',
        partsTested: 10,
        holidaysFound: 3,
        per100Parts: 30,
      },
      {
        weekStart: '2026-03-09',
        weekLabel: '2026-W11',
        partsTested: 1,
        holidaysFound: 1,
        per100Parts: 100,
      },
    ])
  })

  it('sums throughput per week and shift, coated area × quantity', async () => {
    const r = await report(PERIOD)
    // W10 shift 1: 10 × 0.5 m² = 5 m². W11 shift 2: L3, no areas = 0. W11 shift 3: 7 × 1.0 × 2 = 14 m².
    expect(r.throughput).toEqual([
      { weekStart: '2026-03-02', weekLabel: '2026-W10', shift: '1', parts: 10, coatedAreaM2: 5 },
      { weekStart: '2026-03-09', weekLabel: '2026-W11', shift: '2', parts: 3, coatedAreaM2: 0 },
      { weekStart: '2026-03-09', weekLabel: '2026-W11', shift: '3', parts: 7, coatedAreaM2: 14 },
    ])
    expect(r.totals.coatedAreaM2).toBe(19)
  })

  it('applies line, shift, customer, spec and part-family filters', async () => {
    const weeks = async (q: string) =>
      (await report(`${PERIOD}&${q}`)).yieldByWeek.map((w) => [w.weekLabel, w.inspected, w.passed])
    // The booth (L3) is the only liquid-epoxy lot; shift 3 is L2 alone; customer 2 is L3.
    expect(await weeks('line=fbe-powder')).toEqual([
      ['2026-W10', 10, 9],
      ['2026-W11', 7, 4],
    ])
    expect(await weeks('shift=3')).toEqual([['2026-W11', 7, 4]])
    expect(await weeks(`customerId=${ids.c2}`)).toEqual([['2026-W11', 3, 3]])
    expect(await weeks(`specId=${ids.specB}`)).toEqual([['2026-W11', 3, 3]])
    // Family = part number up to the first dash, any case in the query: "ft" → FT-200-MJ.
    expect(await weeks('family=ft')).toEqual([['2026-W11', 3, 3]])
    // Spec choice: TA-1 has 17 measured parts, TB-1 3; the thickness section takes TA-1.
    const r = await report(PERIOD)
    expect(r.specChoices.map((s) => [s.code, s.measuredParts])).toEqual([
      ['TA-1', 17],
      ['TB-1', 3],
    ])
    expect(r.thickness?.specCode).toBe('TA-1')
    expect((await report(`${PERIOD}&specId=${ids.specB}`)).thickness?.n).toBe(3)
  })

  it('defaults to the last 13 weeks and refuses a period that ends before it starts', async () => {
    const r = await report('')
    expect(r.filter.to >= r.filter.from).toBe(true)
    expect((Date.parse(r.filter.to) - Date.parse(r.filter.from)) / 86_400_000).toBe(90)
    const bad = await request(app)
      .get('/api/trends?from=2026-03-10&to=2026-03-01')
      .set('Authorization', auth)
    expect(bad.status).toBe(400)
    const badFamily = await request(app)
      .get('/api/trends?family=VB%27%3B--')
      .set('Authorization', auth)
    expect(badFamily.status).toBe(400)
  })

  it('lists the filter options with the part families seen in the period', async () => {
    const res = await request(app).get(`/api/trends/options?${PERIOD}`).set('Authorization', auth)
    expect(res.status).toBe(200)
    // VB: L1 10 + L2 7 = 17; FT: L3 4 (the unsampled part has a part number too).
    expect(res.body.families).toEqual([
      { family: 'VB', parts: 17 },
      { family: 'FT', parts: 4 },
    ])
    expect(res.body.shifts).toEqual(['1', '2', '3'])
  })
})

describe('Line health: CSV export', () => {
  it('answers the filtered parts as CSV with quotes doubled and formulas defused', async () => {
    const res = await request(app)
      .get(`/api/trends/export.csv?${PERIOD}&family=FT`)
      .set('Authorization', auth)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="line-health-2026-03-02-to-2026-03-15.csv"',
    )
    const lines = res.text
      .replace(/^\uFEFF/, '')
      .split('\r\n')
      .filter(Boolean)
    expect(lines[0]!.startsWith('inspected_at,week,lot_number,line,shift,customer,spec')).toBe(true)
    // Three sampled parts of family FT; the unsampled one is left out.
    expect(lines).toHaveLength(4)
    // RFC 4180: the cell holds a comma and quotes → quoted, quotes doubled; it starts with "=" →
    // a leading apostrophe so a spreadsheet shows text (OWASP CSV injection).
    expect(lines[1]).toContain(`,"'=HYPERLINK(""x""), tee",`)
    expect(lines[1]).toContain(',Trend Pipeline Contractors,TB-1,1,FT-200-MJ,FT,')
    expect(lines[1]!.endsWith(',1,pass,pass,100,')).toBe(true)
  })
})
