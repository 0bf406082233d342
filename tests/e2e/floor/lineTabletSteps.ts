/** Steps of the line-tablet tests, as an operator does them: taps, the number pad, Enter. */
import { expect } from 'vitest'
import type { Page } from 'playwright-core'

export async function tapOption(page: Page, fieldTest: string, option: string | RegExp) {
  await page.locator(`[data-test="${fieldTest}"] .v-field`).first().tap()
  await page.getByRole('option', { name: option }).first().tap()
}

/** Chooses the gauge and confirms it (the card folds to one line). */
export async function useGauge(page: Page, serial: string) {
  await page.locator(`[data-test="instrument-picker"] [data-serial="${serial}"]`).tap()
  await page.locator('[data-test="gauge-card"] [data-test="section-save"]').tap()
  await page.locator('[data-test="gauge-in-use"]').waitFor()
}

/** One reading typed on the on-screen pad, then its Save key. */
export async function padReading(page: Page, value: string) {
  for (const k of value) await page.locator(`[data-test="reading-entry"] [data-key="${k}"]`).tap()
  await page.locator('[data-test="reading-entry"] [data-key="save"]').tap()
  await expect.poll(() => page.locator('[data-test="reading-input"] input').inputValue()).toBe('')
}

/** One reading typed with the tablet's number keyboard and its Enter (go) key. */
export async function keyReading(page: Page, value: string) {
  const input = page.locator('[data-test="reading-input"] input')
  await input.tap()
  await input.fill(value)
  await input.press('Enter')
  await expect.poll(() => input.inputValue()).toBe('')
}

export async function slotText(page: Page): Promise<string> {
  return (await page.locator('[data-test="reading-slot"]').textContent())?.trim() ?? ''
}

export async function progressText(page: Page): Promise<string> {
  return (
    (
      await page
        .locator('[data-test="verdict-panel"]:visible [data-test="plan-progress"]')
        .first()
        .textContent()
    )?.trim() ?? ''
  )
}

export async function badge(page: Page): Promise<{ waiting: number; text: string }> {
  const b = page.locator('[data-test="queue-badge"]')
  return {
    waiting: Number(await b.getAttribute('data-waiting')),
    text: (await b.textContent())?.trim() ?? '',
  }
}
