/**
 * The line tablet for browser tests: the shell's Chromium launcher settings plus a touch screen
 * (hasTouch), so tests drive the screens with tap() and the keyboard's Enter like an operator
 * with gloves — no hover, no mouse-only gestures. API helpers check what reached the server.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { BASE_URL, DEMO_PASSWORD } from '../support/browser'
import type { LotDetail, PartDetail } from '../../../shared/api/lots'

export interface Tablet {
  context: BrowserContext
  page: Page
  problems: string[]
  close: () => Promise<void>
}

export async function openTablet(viewport: { width: number; height: number }): Promise<Tablet> {
  const profile = mkdtempSync(join(tmpdir(), 'filmtrail-tablet-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport,
    hasTouch: true,
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
  page.setDefaultTimeout(10_000)
  const problems: string[] = []
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`))
  page.on('console', (m) => {
    // Requests that fail while the test holds the tablet offline are the point of the test.
    if (m.type() === 'error' && !/ERR_INTERNET_DISCONNECTED|Failed to load resource/.test(m.text()))
      problems.push(`console: ${m.text()}`)
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

/** The sign-in form, by touch. */
export async function signInByTouch(page: Page, email: string) {
  await page.goto(`${BASE_URL}/sign-in`)
  await page.getByLabel('E-mail').tap()
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
  await page.getByLabel('Password', { exact: true }).press('Enter')
  await page.getByRole('button', { name: 'Your account and units' }).waitFor()
}

export async function apiToken(email: string): Promise<string> {
  const res = await fetch(`${BASE_URL}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  return ((await res.json()) as { token: string }).token
}

export async function apiGet<T>(token: string, path: string): Promise<T> {
  const res = await fetch(`${BASE_URL}${path}`, { headers: { Authorization: `Bearer ${token}` } })
  if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`)
  return (await res.json()) as T
}

export const getPart = (token: string, id: number) => apiGet<PartDetail>(token, `/api/parts/${id}`)
export const getLot = (token: string, id: number) => apiGet<LotDetail>(token, `/api/lots/${id}`)

/** Buttons and tabs in the page that a gloved finger would miss (< 48 px, [P] touch-target guidance). */
export async function smallTargets(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    [
      ...document.querySelectorAll<HTMLElement>(
        'main .v-btn, main [role="tab"], main .reading, main .spot-name, header .v-btn',
      ),
    ]
      .map((el) => ({ el, r: el.getBoundingClientRect() }))
      .filter(({ r }) => r.width > 0 && r.height > 0 && (r.height < 47.5 || r.width < 47.5))
      .map(
        ({ el, r }) =>
          `${el.textContent?.trim() || el.getAttribute('aria-label')} ${Math.round(r.width)}×${Math.round(r.height)}`,
      ),
  )
}

export async function sidewaysOverflow(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
}
