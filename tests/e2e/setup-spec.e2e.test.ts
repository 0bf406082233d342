import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  BASE_URL,
  VIEWPORTS,
  chooseOption,
  openBrowser,
  screenshot,
  signIn,
  type BrowserSession,
} from './support/browser'
import type { SpecRow } from '../../shared/api/setup'

/**
 * An administrator signs in at the start URL, switches film thickness to mils, creates a coating
 * spec through every section of the form and finds it in the list with its band in mils, while
 * the server keeps micrometres (1 mil = 25.4 µm exactly, TRADE.md preamble [C]).
 */
describe('Setup → Coating specs, in the browser', () => {
  let b: BrowserSession

  beforeAll(async () => {
    b = await openBrowser(VIEWPORTS.tabletLandscape)
  })
  afterAll(async () => {
    await b?.close()
  })

  it('sends a signed-out visitor from the start URL to sign-in, and refuses a wrong password with the server’s words', async () => {
    const { page } = b
    await page.goto(BASE_URL)
    await page.waitForURL(/\/sign-in/)
    await page.getByRole('heading', { name: 'Sign in' }).waitFor()
    await screenshot(page, 'sign-in-1280x800')
    await page.getByLabel('E-mail').fill('admin@harrowgate.example')
    await page.getByLabel('Password', { exact: true }).fill('not-the-password-1')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect(
      page.getByRole('alert').filter({ hasText: 'E-mail or password is not right' }).waitFor(),
    ).resolves.toBeUndefined()
    // That refusal is a 401 in the console by design; from here on the console must stay clean.
    b.problems.length = 0
  })

  it('signs the admin in to a home that lists instruments to watch and only the pages that work', async () => {
    const { page } = b
    await signIn(page, 'admin@harrowgate.example')
    await page.getByText('Calibration to watch').waitFor()
    const drawer = page.getByRole('navigation')
    for (const entry of [
      'Home',
      'Coating specs',
      'Instruments',
      'Customers',
      'People',
      'Plant settings',
    ]) {
      await expect.poll(() => drawer.getByText(entry, { exact: true }).count()).toBe(1)
    }
    await page.waitForLoadState('networkidle')
    await screenshot(page, 'admin-home-1280x800')
  })

  it('creates a spec typed in mils and lists it with the same band, stored in µm', async () => {
    const { page } = b
    // Film thickness in mils for this person (PATCH /api/auth/me/preferences).
    await page.getByRole('button', { name: 'Your account and units' }).click()
    await page
      .getByRole('group', { name: 'Film thickness' })
      .getByRole('button', { name: 'mil' })
      .click()
    await page.keyboard.press('Escape')

    await page.getByRole('navigation').getByText('Coating specs', { exact: true }).click()
    await page.getByRole('heading', { name: 'Coating specs' }).waitFor()
    await page.getByRole('link', { name: 'New spec' }).click()
    await page.getByRole('heading', { name: 'New coating spec' }).waitFor()

    await page.getByLabel('Spec code').fill('E2E-FBE-16')
    await page.getByLabel('Title').fill('FBE on ductile-iron valve bodies, browser test')
    await page.getByLabel('Specified minimum').fill('12')
    await page.getByLabel('Specified maximum').fill('20')
    await page.getByLabel('Profile minimum').fill('1.5')
    await page.getByLabel('Profile maximum').fill('4')
    await page.getByText('High-voltage holiday testers can injure.').waitFor()
    await page.getByLabel('Edition of the standard').fill('as cited by the buyer')
    await page.getByLabel('DSC, ΔTg window (FBE, CSA Z245.20 method)').check()
    await page.getByLabel('ΔTg, at least').fill('-2')
    await page.getByLabel('ΔTg, at most').fill('3')
    await page.getByLabel('Tape test (ASTM D3359)').check()
    await chooseOption(page, 'Grade, at least', '4B or better')
    await screenshot(page, 'spec-form-filled-1280x800')
    await page.getByRole('button', { name: 'Create spec' }).click()

    await page.getByText('Spec created as version 1.').waitFor()
    await page.getByText('Versions', { exact: true }).waitFor()
    await screenshot(page, 'spec-detail-1280x800')
    await page.getByRole('link', { name: 'All specs' }).click()
    const row = page.locator('tr[data-spec-code="E2E-FBE-16"]')
    await row.waitFor()
    await expect
      .poll(() => row.locator('[data-test="spec-band"]').textContent())
      .toBe('12.0–20.0 mil')
    await screenshot(page, 'spec-list-1280x800')

    // What was stored: micrometres, converted exactly (12 × 25.4 = 304.8; 20 × 25.4 = 508).
    const specs = await page.evaluate(async () => {
      const res = await fetch('/api/specs', {
        headers: { Authorization: `Bearer ${localStorage.getItem('filmtrail.token')}` },
      })
      return (await res.json()) as unknown
    })
    const created = (specs as SpecRow[]).find((s) => s.code === 'E2E-FBE-16')
    expect(created?.current.content.thickness.minUm).toBeCloseTo(304.8, 9)
    expect(created?.current.content.thickness.maxUm).toBeCloseTo(508, 9)
    expect(created?.current.content.surfacePrep.profileMinUm).toBeCloseTo(38.1, 9)
    expect(created?.current.content.cure.dsc).toEqual({ minDeltaTgC: -2, maxDeltaTgC: 3 })
    expect(created?.current.content.adhesion.crossCut).toEqual({ method: 'B', minGrade: 4 })
    expect(b.problems).toEqual([])
  })
})
