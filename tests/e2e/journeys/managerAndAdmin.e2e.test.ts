import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  BASE_URL,
  VIEWPORTS,
  chooseOption,
  openBrowser,
  signIn,
  type BrowserSession,
} from '../support/browser'
import { checkPage } from './journeySupport'

/**
 * The desk roles at the floor tablet (1280×800) and the desk PC (1440×900): the plant manager
 * opens Line health from an address with its filters and sees every chart (demo seed history);
 * the administrator adds a person and edits a spec a lot was already inspected against, and the
 * page reports the new version. Each main page is screenshotted and checked with axe-core.
 */
const iso = (d: Date) => d.toISOString().slice(0, 10)
const to = iso(new Date())
const from = iso(new Date(Date.now() - 90 * 86_400_000))
// A spec per size, each used by a seeded lot (HFW-FBE-01 stays at version 1 for the floor tests).
const SPEC_BY_SIZE = { '1280x800': 'AWB-FBE-2', '1440x900': 'HFW-LE-300' } as const

for (const [size, viewport] of [
  ['1280x800', VIEWPORTS.tabletLandscape],
  ['1440x900', VIEWPORTS.desktop],
] as const) {
  describe(`manager and administrator at ${size}`, () => {
    let b: BrowserSession
    beforeAll(async () => {
      b = await openBrowser(viewport)
    })
    afterAll(async () => {
      await b?.close()
    })

    it('the manager opens Line health with the filters of the URL and sees the charts', async () => {
      const { page } = b
      await signIn(page, 'manager@harrowgate.example')
      await checkPage(page, `manager-home-${size}`)
      await page.goto(`${BASE_URL}/line-health?from=${from}&to=${to}&line=fbe-powder`)
      await page.getByRole('heading', { name: 'Line health' }).waitFor()
      await page.locator('[data-test="trend-yield"] canvas').waitFor()
      await expect
        .poll(() => page.locator('[data-test="filter-from"] input').inputValue())
        .toBe(from)
      await expect
        .poll(() => page.locator('[data-test="filter-line"]').textContent())
        .toContain('FBE powder line')
      for (const card of ['trend-yield', 'trend-pareto', 'trend-histogram', 'trend-throughput']) {
        await expect
          .poll(() => page.locator(`[data-test="${card}"] canvas`).count(), { message: card })
          .toBe(1)
      }
      await checkPage(page, `trends-${size}`)
      expect(b.problems).toEqual([])
      await page.getByRole('button', { name: 'Your account and units' }).click()
      await page.getByRole('button', { name: 'Sign out' }).click()
      await page.waitForURL(/\/sign-in/)
    })

    it('the administrator adds a person who can then sign in', async () => {
      const { page } = b
      const email = `inspector-${size}@harrowgate.example`
      await signIn(page, 'admin@harrowgate.example')
      await checkPage(page, `admin-home-${size}`)
      await page.goto(`${BASE_URL}/setup/people`)
      await page.getByRole('heading', { name: 'People' }).waitFor()
      await checkPage(page, `setup-people-${size}`)
      await page.getByRole('button', { name: 'Add a person' }).click()
      await page.getByLabel('Full name').fill(`Jordan Vale ${size}`)
      await page.getByLabel('E-mail (signs in with it)').fill(email)
      await chooseOption(page, 'Role', 'Coating operator')
      await page.getByLabel('First password').fill('first-shift-2026')
      await checkPage(page, `setup-people-add-${size}`)
      await page.getByRole('button', { name: 'Add person' }).click()
      await page.getByText(`can now sign in as ${email}`).waitFor()
      // The notice shows at once; the list is fetched again after it, so wait for the row.
      await page.getByRole('cell', { name: email }).waitFor()
      await expect.poll(() => page.getByRole('cell', { name: email }).count()).toBe(1)
      const res = await fetch(`${BASE_URL}/api/auth/login`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email, password: 'first-shift-2026' }),
      })
      expect(res.status, 'the new person signs in').toBe(200)
    })

    it('the administrator edits a spec a lot used, and the page reports a new version', async () => {
      const { page } = b
      const code = SPEC_BY_SIZE[size]
      await page.goto(`${BASE_URL}/setup/specs`)
      const row = page.locator(`tr[data-spec-code="${code}"]`)
      await row.waitFor()
      await checkPage(page, `setup-specs-${size}`)
      await row.click()
      await page.getByText('Versions', { exact: true }).waitFor()
      const before = Number(
        /v(\d+)/.exec((await page.getByText(/Current version/).textContent())!)![1],
      )
      await page.getByRole('link', { name: /Edit/ }).click()
      await page.getByLabel('Edition of the standard').first().waitFor()
      await checkPage(page, `setup-spec-edit-${size}`)
      await page
        .getByLabel('Edition of the standard')
        .first()
        .fill(`as cited by the buyer, ${size}`)
      await page.locator('[data-test="save-spec"]').click()
      const saved = page.locator('[data-test="spec-saved"]')
      await saved.waitFor()
      await expect.poll(() => saved.textContent()).toContain(`Saved as version ${before + 1}.`)
      await checkPage(page, `setup-spec-detail-${size}`)
      expect(b.problems).toEqual([])
    })
  })
}
