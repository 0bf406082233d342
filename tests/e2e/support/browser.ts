import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { BASE_URL, SCREENSHOT_DIR } from './serverInfo'
import { DEMO_PASSWORD } from '../../../server/db/seeders/demoPassword'

export { BASE_URL, DEMO_PASSWORD }

export const VIEWPORTS = {
  desktop: { width: 1440, height: 900 },
  tabletLandscape: { width: 1280, height: 800 },
  tabletPortrait: { width: 800, height: 1280 },
} as const

export interface BrowserSession {
  context: BrowserContext
  page: Page
  /** Every console error and failed request, so a test can assert the page ran clean. */
  problems: string[]
  close: () => Promise<void>
}

/** Debian's Chromium through playwright-core, in a fresh profile that is deleted on close. */
export async function openBrowser(
  viewport: { width: number; height: number } = VIEWPORTS.desktop,
): Promise<BrowserSession> {
  const profile = mkdtempSync(join(tmpdir(), 'filmtrail-e2e-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  })
  const page = context.pages()[0] ?? (await context.newPage())
  // A step that has not happened in 10 s is a failure, not a slow machine.
  page.setDefaultTimeout(10_000)
  const problems: string[] = []
  page.on('console', (m) => m.type() === 'error' && problems.push(`console: ${m.text()}`))
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`))
  page.on('requestfailed', (r) => {
    const why = r.failure()?.errorText ?? ''
    // ERR_ABORTED is the browser cancelling a fetch still in flight when the test navigates on
    // (a user leaving the page does the same); a refused or broken request is still a problem.
    if (why === 'net::ERR_ABORTED') return
    problems.push(`request failed: ${r.url()} ${why}`)
  })
  return {
    context,
    page,
    problems,
    close: async () => {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}

/** Signs in through the real form, as a person would, and waits for the signed-in shell. */
export async function signIn(page: Page, email: string, password: string = DEMO_PASSWORD) {
  if (!page.url().includes('/sign-in')) await page.goto(`${BASE_URL}/sign-in`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password', { exact: true }).fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.getByRole('button', { name: 'Your account and units' }).waitFor()
}

/**
 * Picks `option` in the Vuetify select labelled `label` (its input is hidden; the field is the
 * target) and waits until the field shows it. On a busy machine a click can land while the menu
 * is still opening and select nothing (a fresh-clone CI run saw it): then it opens and picks again.
 */
export async function chooseOption(page: Page, label: string, option: string) {
  const field = page.locator('.v-input').filter({ has: page.locator('label', { hasText: label }) })
  const chosen = field.locator('.v-select__selection').getByText(option, { exact: true })
  for (let attempt = 1; ; attempt++) {
    const menu = page.getByRole('listbox')
    if (!(await menu.isVisible())) await field.locator('.v-field').first().click()
    await page.getByRole('option', { name: option, exact: true }).click()
    try {
      await chosen.waitFor({ timeout: 3000 })
      return
    } catch (err) {
      if (attempt === 3) throw err
    }
  }
}

export async function screenshot(page: Page, name: string, fullPage = true) {
  await page.screenshot({ path: join(SCREENSHOT_DIR, `${name}.png`), fullPage })
}
