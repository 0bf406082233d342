import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import {
  BASE_URL,
  VIEWPORTS,
  openBrowser,
  screenshot,
  signIn,
  type BrowserSession,
} from '../support/browser'
import type { LotDetail, PartDetail } from '../../../shared/api/lots'
import type { DecisionRow, NonconformanceRow } from '../../../shared/api/review'
import { api, apiToken, recordRetestByApi } from './reviewSteps'

/**
 * The QA loop in the browser, on the demo seed's lot awaiting review with a failing part (a
 * spot below the SSPC-PA 2 level 2 spot minimum of spec AWB-FBE-2, 12–16 mil): the supervisor
 * holds it (the reason is required), gives its automatic nonconformance the disposition "repair
 * and retest", the operator records the retest (API, own token) and sends the lot to review
 * from the line's lot page, the supervisor's first release is refused while the nonconformance
 * is open, then it is closed with a verification and the lot released. The supervisor recorded
 * nothing on this lot, so the release is independent of the recorder (the operator).
 */
const SUPERVISOR = 'supervisor@harrowgate.example'
const OPERATOR = 'operator@harrowgate.example'
// AWB-FBE-2: 304.8–406.4 µm; spot means 335–370 µm sit inside the band and the level 2 spot limits.
const RETEST_SPOTS_UM = [
  [350, 355, 352],
  [340, 336, 338],
  [365, 370, 368],
  [345, 348, 350],
  [360, 358, 356],
]

/** Both sizes the supervisor works at: the desk PC and the floor tablet in landscape. */
async function shootBoth(page: Page, name: string) {
  await page.waitForLoadState('networkidle')
  // A full-page shot of a scrolled page draws the fixed app bar where the viewport was.
  await page.evaluate(() => window.scrollTo(0, 0))
  await screenshot(page, `${name}-1440x900`)
  await page.setViewportSize(VIEWPORTS.tabletLandscape)
  await page.waitForTimeout(300)
  await page.evaluate(() => window.scrollTo(0, 0))
  await screenshot(page, `${name}-1280x800`)
  const overflow = await page.evaluate(
    () => document.documentElement.scrollWidth - window.innerWidth,
  )
  expect(overflow, `${name}: wider than 1280 px`).toBeLessThanOrEqual(0)
  await page.setViewportSize(VIEWPORTS.desktop)
}

/** Expected refusals answer 4xx; Chromium logs each as a console error. Anything else is a problem. */
const unexpected = (problems: string[]) => problems.filter((p) => !/status of 409/.test(p))

describe('QA review in the browser', () => {
  let sup: BrowserSession
  let op: BrowserSession
  let supToken: string
  let opToken: string
  let lot: LotDetail
  let nc: NonconformanceRow

  beforeAll(async () => {
    supToken = await apiToken(SUPERVISOR)
    opToken = await apiToken(OPERATOR)
    const queue = (
      await api<(LotDetail & { lotVerdict: { status: string } })[]>(
        supToken,
        'GET',
        '/api/review/queue',
      )
    ).data
    const failing = queue.find(
      (q) => q.status === 'awaiting-review' && q.lotVerdict.status === 'fail',
    )
    expect(failing, 'the seed has a lot awaiting review with a failing part').toBeTruthy()
    lot = (await api<LotDetail>(supToken, 'GET', `/api/lots/${failing!.id}`)).data
    sup = await openBrowser(VIEWPORTS.desktop)
    op = await openBrowser(VIEWPORTS.tabletLandscape)
  })
  afterAll(async () => {
    await sup?.close()
    await op?.close()
  })

  it('shows the lot in the queue and holds it, with a reason', async () => {
    const { page } = sup
    await signIn(page, SUPERVISOR)
    await page.waitForLoadState('networkidle')
    await page.goto(`${BASE_URL}/review/queue`)
    const row = page.locator(`[data-test="queue-awaiting"] [data-lot="${lot.lotNumber}"]`)
    await row.waitFor()
    await expect
      .poll(() => row.locator('[data-status="fail"]').textContent())
      .toContain('Nonconforming')
    await shootBoth(page, 'review-queue')
    await row.locator('.lot-link').click()

    await page.locator('[data-test="review-lot-title"]').waitFor()
    const failingPart = page.locator('.part-card[data-status="fail"]').first()
    await expect
      .poll(() => failingPart.locator('[data-criterion="thickness"][data-status="fail"]').count())
      .toBe(1)
    await expect(
      failingPart.locator('[data-flag="low"]').count(),
      'the low spot is marked in the readings',
    ).resolves.toBeGreaterThan(0)
    await shootBoth(page, 'review-lot')

    await page.locator('[data-test="decide-hold"]').click()
    await page.locator('[data-test="decision-confirm"]').click()
    await expect(page.locator('[data-test="decision-reason"]').textContent()).resolves.toContain(
      'Hold and reject need a reason',
    )
    await page
      .locator('[data-test="decision-reason"] textarea')
      .fill('Thin film on one spot: repair and retest before release')
    await page.locator('[data-test="decision-confirm"]').click()
    await expect
      .poll(() => page.locator('[data-test="lot-status"]').textContent(), { timeout: 10_000 })
      .toContain('On hold')
    await expect
      .poll(() => page.locator('[data-test="review-notice"]').textContent())
      .toContain('put on hold')
  })

  it('gives the nonconformance the disposition "repair and retest"', async () => {
    const { page } = sup
    const ncLink = page.locator('[data-test="lot-ncs"] [data-nc]').first()
    const number = (await ncLink.getAttribute('data-nc'))!
    await ncLink.click()
    await expect
      .poll(() => page.locator('[data-test="nc-title"]').textContent(), { timeout: 10_000 })
      .toBe(number)
    await expect
      .poll(() => page.locator('[data-test="nc-defect"]').textContent())
      .toContain('Thin film')
    await page.locator('[data-test="nc-disposition"] input[value="repair-retest"]').check()
    await page
      .locator('[name="disposition-note"]')
      .fill('Sweep-blast the thin spot, recoat locally, re-measure the part')
    await page.locator('[data-test="nc-disposition-save"]').click()
    await expect
      .poll(() => page.locator('[data-test="nc-status"]').textContent(), { timeout: 10_000 })
      .toContain('Dispositioned')
    await expect
      .poll(() => page.locator('[data-test="nc-current-disposition"]').textContent())
      .toContain('Repair and retest')
    await shootBoth(page, 'review-nc')
    nc = (
      await api<NonconformanceRow[]>(supToken, 'GET', `/api/nonconformances?lotId=${lot.id}`)
    ).data.find((n) => n.number === number)!
    const back = (await api<LotDetail>(supToken, 'GET', `/api/lots/${lot.id}`)).data
    expect(back.status, 'the repair sends the lot back to the floor').toBe('open')
  })

  it('the operator records the retest and sends the lot to review from the line', async () => {
    const partId = nc.parts[0]!.id
    const part = await recordRetestByApi(opToken, partId, RETEST_SPOTS_UM)
    expect(part.round).toBe(2)
    expect(part.verdict?.status, part.verdict?.reason).toBe('pass')
    const { page } = op
    await signIn(page, OPERATOR)
    // Let the home page finish loading: a goto mid-load aborts its chunk requests.
    await page.waitForLoadState('networkidle')
    await page.goto(`${BASE_URL}/line/lots/${lot.id}`)
    await page.locator('[data-test="send-to-review"]').click()
    await expect
      .poll(() => page.locator('[data-test="send-to-review-done"]').textContent())
      .toContain('sent to review')
    expect(unexpected(op.problems)).toEqual([])
  })

  it('refuses the release while the nonconformance is open, then closes it and releases', async () => {
    const { page } = sup
    await page.goto(`${BASE_URL}/review/lots/${lot.id}`)
    await expect
      .poll(() => page.locator('[data-test="lot-status"]').textContent(), { timeout: 10_000 })
      .toContain('Awaiting review')
    await page.locator('[data-test="decide-release"]').click()
    await page.locator('[data-test="decision-confirm"]').click()
    const blockers = page.locator('[data-test="release-blockers"]')
    await blockers.waitFor()
    await expect.poll(() => blockers.textContent()).toContain(nc.number)
    await screenshot(page, 'review-release-blocked-1440x900', false)

    await blockers.getByRole('link', { name: nc.number }).click()
    await page
      .locator('[data-test="nc-verification"] textarea')
      .fill('Round 2 re-measured: 5 spots 337–368 µm, holiday test clean; seen on the part')
    await page.locator('[data-test="nc-close"]').click()
    await page.locator('[data-test="nc-closed"]').waitFor()
    await expect
      .poll(() => page.locator('[data-test="nc-status"]').textContent())
      .toContain('Closed')

    await page.goto(`${BASE_URL}/review/lots/${lot.id}`)
    await page.locator('[data-test="decide-release"]').click()
    await page.locator('[data-test="decision-confirm"]').click()
    await expect
      .poll(() => page.locator('[data-test="lot-status"]').textContent(), { timeout: 10_000 })
      .toContain('Released')
    await page.locator('[data-test="reopen-card"]').waitFor()
    await shootBoth(page, 'review-lot-released')

    const decisions = (await api<DecisionRow[]>(supToken, 'GET', `/api/lots/${lot.id}/decisions`))
      .data
    expect(decisions.map((d) => d.decision)).toEqual(['hold', 'release'])
    expect(decisions[1]!.independenceWaived).toBe(false)
    const part = (await api<PartDetail>(supToken, 'GET', `/api/parts/${nc.parts[0]!.id}`)).data
    expect(
      part.history.some((r) => r.round === 1),
      'the first round is kept beside the retest',
    ).toBe(true)
  })

  it('tells the lot’s story in its history, oldest first', async () => {
    const { page } = sup
    await page.locator('[data-test="lot-history-link"]').click()
    const timeline = page.locator('[data-test="history-timeline"]')
    await timeline.waitFor()
    const actions = await timeline
      .locator(':scope > li')
      .evaluateAll((els) => els.map((e) => e.getAttribute('data-action')))
    const order = [
      'lot.hold',
      'nonconformance.disposition',
      'lot.submit',
      'nonconformance.close',
      'lot.release',
    ]
    const at = order.map((a) => actions.lastIndexOf(a))
    expect(
      at.every((i) => i >= 0),
      `history has ${order.join(', ')}: ${actions.join(', ')}`,
    ).toBe(true)
    expect([...at].sort((a, b) => a - b)).toEqual(at)
    await expect.poll(() => timeline.textContent()).toContain('Thin film on one spot')
    await shootBoth(page, 'review-history')
    expect(unexpected(sup.problems)).toEqual([])
  })
})
