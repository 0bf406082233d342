import { execFileSync } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  BASE_URL,
  VIEWPORTS,
  openBrowser,
  screenshot,
  signIn,
  type BrowserSession,
} from '../support/browser'
import { e2eDatabaseUrl } from '../support/serverInfo'

/**
 * A plant manager opens Line health from a bookmarked address (period and line in the URL), reads
 * the charts, flips one to its table and downloads the CSV. History: 16 weeks written by
 * scripts/generate-history.ts into the e2e database (the demo seed is already there).
 */
const iso = (d: Date) => d.toISOString().slice(0, 10)
const to = iso(new Date())
const from = iso(new Date(Date.now() - 111 * 86_400_000))

describe('Line health, in the browser', () => {
  let b: BrowserSession

  beforeAll(async () => {
    execFileSync(
      'npx',
      ['tsx', 'scripts/generate-history.ts', '--parts', '2500', '--weeks', '16', '--skip-seed'],
      {
        env: { ...process.env, DATABASE_URL: e2eDatabaseUrl(), NODE_ENV: 'test' },
        stdio: ['ignore', 'ignore', 'inherit'],
      },
    )
    b = await openBrowser(VIEWPORTS.tabletLandscape)
  })
  afterAll(async () => {
    await b?.close()
  })

  it('opens with the filters of the URL and shows every chart', async () => {
    const { page } = b
    await signIn(page, 'manager@harrowgate.example')
    await expect
      .poll(() => page.getByRole('navigation').getByText('Line health', { exact: true }).count())
      .toBe(1)
    await page.goto(`${BASE_URL}/line-health?from=${from}&to=${to}&line=fbe-powder`)
    await page.getByRole('heading', { name: 'Line health' }).waitFor()
    await page.locator('[data-test="trend-capability"]').waitFor()
    await expect.poll(() => page.locator('[data-test="filter-from"] input').inputValue()).toBe(from)
    await expect
      .poll(() => page.locator('[data-test="filter-line"]').textContent())
      .toContain('FBE powder line')
    for (const card of [
      'trend-yield',
      'trend-pareto',
      'trend-histogram',
      'trend-control',
      'trend-holidays',
      'trend-throughput',
    ]) {
      await expect
        .poll(() => page.locator(`[data-test="${card}"] canvas`).count(), { message: card })
        .toBe(1)
    }
    const reading = await page.locator('[data-test="cap-reading"]').textContent()
    expect(reading).toMatch(/Cp|Cpk|Cpl|Cpu/)
    await page.waitForLoadState('networkidle')
    await screenshot(page, 'line-health-1280x800')
    expect(b.problems).toEqual([])
  })

  it('shows a chart as a table, keeps a changed filter in the URL, and downloads the CSV', async () => {
    const { page } = b
    await page.locator('[data-test="trend-yield-table-toggle"]').click()
    const rows = page.locator('[data-test="trend-yield"] tbody tr')
    await rows.first().waitFor()
    expect(await rows.count()).toBeGreaterThanOrEqual(15)
    await page.locator('[data-test="filter-shift"]').click()
    await page.getByRole('option', { name: 'Shift 3' }).click()
    // router.replace changes the address without a page load.
    await expect.poll(() => page.url(), { timeout: 15_000 }).toContain('shift=3')
    expect(page.url()).toContain('line=fbe-powder')
    const download = page.waitForEvent('download', { timeout: 30_000 })
    await page.locator('[data-test="trends-csv"]').click()
    expect((await download).suggestedFilename()).toBe(`line-health-${from}-to-${to}.csv`)
    await page.setViewportSize(VIEWPORTS.desktop)
    await page.waitForLoadState('networkidle')
    await screenshot(page, 'line-health-shift3-1440x900')
    expect(b.problems).toEqual([])
  })
})
