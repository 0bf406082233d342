/**
 * A supervisor issues a certificate for a released demo lot; the customer signs in, finds it in
 * the portal and downloads the PDF; the QR code read from that PDF opens the public check page.
 * Then a reissue and a withdrawal show on the check pages. Screenshots go to test-output/.
 */
import { readFile } from 'node:fs/promises'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  BASE_URL,
  VIEWPORTS,
  openBrowser,
  screenshot,
  signIn,
  type BrowserSession,
} from '../support/browser'
import { decodeQr, readPdfText, renderPages } from '../../unit/pdf/pdfReading'

describe('certificates in the browser', () => {
  let staff: BrowserSession
  let customer: BrowserSession
  let number = ''
  let lotNumber = ''
  let verifyPath = ''

  beforeAll(async () => {
    staff = await openBrowser(VIEWPORTS.desktop)
    customer = await openBrowser(VIEWPORTS.tabletLandscape)
    // The PDF is rendered while the issuing request waits: give that step room on a busy machine.
    staff.page.setDefaultTimeout(20_000)
  })
  afterAll(async () => {
    await staff?.close()
    await customer?.close()
  })

  it('a supervisor issues a certificate for a released lot of the demo customer', async () => {
    const { page } = staff
    await signIn(page, 'supervisor@harrowgate.example')
    await page.getByRole('navigation').getByText('Certificates', { exact: true }).last().click()
    await page.getByRole('heading', { name: 'Certificates of conformance' }).waitFor()
    await page.locator('[data-test="lot-search"] input').fill('Ashvale')
    const row = page.locator('[data-test="lots-to-issue"] [data-lot]').first()
    await row.waitFor()
    // Wait for the search answer: every row then belongs to Ashvale Water Board.
    await expect
      .poll(() => page.locator('[data-test="lots-to-issue"]').textContent())
      .not.toMatch(/Wrenfield|Brackenholt|Ostmere/)
    lotNumber = (await row.getAttribute('data-lot')) ?? ''
    await screenshot(page, 'certificates-to-issue')
    await row.getByRole('button', { name: /Issue/ }).click()
    await page.getByText(`Issue a certificate for lot ${lotNumber}`).waitFor()
    await screenshot(page, 'certificates-issue-dialog', false)
    await page.locator('[data-test="issue-confirm"]').click()
    const title = page.locator('[data-test="certificate-title"]')
    await title.waitFor()
    number = ((await title.textContent()) ?? '').replace('Certificate', '').trim()
    expect(number).toMatch(/^HFW-C-\d{2}-\d{5}$/)
    await expect.poll(() => page.locator('[data-state="valid"]').count()).toBeGreaterThan(0)
    // The e-mail is queued for both Ashvale certificate contacts (demo seed).
    await expect
      .poll(() => page.locator('[data-test="deliveries"] [data-recipient]').count())
      .toBe(2)
    await screenshot(page, 'certificate-detail-issued')
  })

  it('the customer signs in to their portal, finds the certificate and downloads the PDF', async () => {
    const { page } = customer
    await signIn(page, 'buyer@ashvale-water.example')
    await page.getByRole('heading', { name: 'Your certificates of conformance' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/portal')
    await page.locator('[data-test="portal-search"] input').fill(lotNumber)
    const row = page.locator(`[data-certificate="${number}"]`)
    await row.waitFor()
    // The search answers a moment after typing stops.
    await expect.poll(() => page.locator('[data-certificate]').count()).toBe(1)
    await screenshot(page, 'portal-search')
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      row.getByRole('button', { name: `Download ${number} as PDF` }).click(),
    ])
    expect(download.suggestedFilename()).toBe(`certificate-${number}.pdf`)
    const pdf = await readFile((await download.path())!)
    const text = await readPdfText(pdf)
    expect(text.all).toContain(number)
    expect(text.all).toContain(lotNumber)
    expect(text.all).toContain('Ashvale Water Board')
    const [page1] = await renderPages(pdf, 150, { first: 1, last: 1 })
    const url = await decodeQr(page1!)
    expect(url).toMatch(/\/verify\/[A-Za-z0-9_-]{22}$/)
    // The e2e server keeps the default PUBLIC_URL; the path is what the QR code points at.
    verifyPath = new URL(url!).pathname
  })

  it('the QR code’s address opens the public check page: valid', async () => {
    const anon = await openBrowser(VIEWPORTS.tabletPortrait)
    try {
      await anon.page.goto(`${BASE_URL}${verifyPath}`)
      const state = anon.page.locator('[data-test="verify-state"]')
      await state.waitFor()
      await expect(state.getAttribute('data-state')).resolves.toBe('valid')
      await expect(anon.page.locator('[data-test="verify-number"]').textContent()).resolves.toBe(
        number,
      )
      // No sign-in, no menu, nothing about the customer or the parts.
      await expect.poll(() => anon.page.getByRole('navigation').count()).toBe(0)
      await expect.poll(() => anon.page.locator('body').textContent()).not.toMatch(/Ashvale|order/i)
      await screenshot(anon.page, 'verify-valid')
      expect(anon.problems).toEqual([])
    } finally {
      await anon.close()
    }
  })

  it('after a reissue the old check page says replaced and links to the new one; a withdrawal shows', async () => {
    const { page } = staff
    await page.locator('[data-test="reissue"]').click()
    await page
      .locator('[data-test="reason"] textarea')
      .fill('Order item number added at the customer’s request')
    await screenshot(page, 'certificate-reissue-dialog', false)
    await page.locator('[data-test="reason-confirm"]').click()
    await expect
      .poll(() => page.locator('[data-test="certificate-title"]').textContent())
      .not.toContain(number)
    await page.locator('[data-test="reason"]').waitFor({ state: 'hidden' })
    await page.locator('[data-test="revoke"]').click()
    await page.locator('[data-test="reason"] textarea').fill('Issued against the wrong order line')
    await page.locator('[data-test="reason-confirm"]').click()
    await page.locator('[data-state="revoked"]').first().waitFor()
    await page.locator('[data-test="reason"]').waitFor({ state: 'hidden' })
    await screenshot(page, 'certificate-detail-withdrawn')

    const anon = await openBrowser(VIEWPORTS.tabletPortrait)
    try {
      await anon.page.goto(`${BASE_URL}${verifyPath}`)
      const state = anon.page.locator('[data-test="verify-state"]')
      await state.waitFor()
      await expect.poll(() => state.getAttribute('data-state')).toBe('superseded')
      await screenshot(anon.page, 'verify-superseded')
      await anon.page.locator('[data-test="successor-link"]').click()
      await expect.poll(() => state.getAttribute('data-state')).toBe('revoked')
      await screenshot(anon.page, 'verify-revoked')
      expect(anon.problems).toEqual([])
    } finally {
      await anon.close()
    }
  })
})
