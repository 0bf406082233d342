/**
 * What every journey does on each main page: wait until it has settled, keep a screenshot as
 * test output (test-output/screenshots/journey-*.png), and run axe-core with the WCAG 2 A/AA
 * rules. Serious and critical findings fail the journey; the rest are printed, so they are seen.
 */
import { expect } from 'vitest'
import { AxeBuilder } from '@axe-core/playwright'
import type { Page } from 'playwright-core'
import { screenshot } from '../support/browser'

export interface AxeFinding {
  page: string
  rule: string
  impact: string
  help: string
  targets: string[]
}

/** Every finding of the run, for the summary printed at the end of each file. */
export const minorFindings: AxeFinding[] = []

export async function checkPage(page: Page, name: string) {
  await page.waitForLoadState('networkidle')
  // Vuetify fades dialogs and menus in; axe must judge the colours at rest, not mid-fade.
  await page.waitForTimeout(400)
  await page.evaluate(() => window.scrollTo(0, 0))
  await screenshot(page, `journey-${name}`)
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa']).analyze()
  const findings: AxeFinding[] = result.violations.map((v) => ({
    page: name,
    rule: v.id,
    impact: v.impact ?? 'unknown',
    help: v.help,
    targets: v.nodes
      .slice(0, 5)
      .map((n) => `${n.target.join(' ')} (${n.any[0]?.message ?? n.failureSummary ?? ''})`),
  }))
  const blocking = findings.filter((f) => f.impact === 'serious' || f.impact === 'critical')
  for (const f of findings.filter((x) => !blocking.includes(x))) {
    minorFindings.push(f)
    console.log(`axe (${f.impact}) on ${name}: ${f.rule} — ${f.help} @ ${f.targets.join(', ')}`)
  }
  // Soft: the journey goes on, so one run lists the findings of every page it reaches.
  expect.soft(blocking, `serious/critical axe violations on ${name}`).toEqual([])
}

/** Picks an option in the Vuetify select marked data-test=fieldTest, with the mouse. */
export async function pick(page: Page, fieldTest: string, option: string | RegExp) {
  await page.locator(`[data-test="${fieldTest}"] .v-field`).first().click()
  await page.getByRole('option', { name: option }).first().click()
}

/** Expected refusals answer 4xx and Chromium logs each as a console error; anything else counts. */
export const unexpected = (problems: string[]) =>
  problems.filter((p) => !/status of (401|409)/.test(p))
