/**
 * The certificate PDF read back: printed values, page numbering, fonts, determinism, QR code.
 * EN 10204 types and long lots: certificateKinds.test.ts.
 */
import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import {
  certificateFingerprint,
  contentFingerprint,
  renderCertificatePdf,
} from '../../../server/pdf/certificatePdf'
import type { CertificateData } from '../../../shared/api/certificates'
import { harrowgateCertificate } from './certificateFixture'
import { decodeQr, MICRO, readPdfText, renderPages, rowPattern } from './pdfReading'

describe('certificate of conformance PDF, EN 10204 type 3.1 in µm', async () => {
  const data = harrowgateCertificate()
  const pdf = await renderCertificatePdf(data)
  const text = await readPdfText(pdf)

  it('prints n, min, mean and max of every part in µm with 0 decimals', () => {
    // Fixture µm values rounded to whole µm by hand: 287.4 → 287, 341.6 → 342, 355.5 → 356 (half up).
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-001',
        'Gate valve body DN150 PN16',
        'H24-7310',
        '1',
        '15',
        '287',
        '342',
        '402',
        'Pass',
      ]),
    )
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-002',
        'Flanged tee DN100',
        'H24-7311',
        '2',
        '12',
        '301',
        '356',
        '419',
        'Pass',
      ]),
    )
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-003',
        'Flanged tee DN100',
        'H24-7312',
        '3',
        '9',
        '276',
        '323',
        '390',
        'Pass',
      ]),
    )
    expect(text.all).toMatch(new RegExp(`Min ${MICRO}m Mean ${MICRO}m Max ${MICRO}m`))
    expect(text.all).toMatch(new RegExp(`Band 250–500 ${MICRO}m`))
  })

  it('names the issuer, the type, the certificate, the lot, the order and the customer', () => {
    for (const expected of [
      'Harrowgate Flow Works',
      'Certificate of conformance',
      'EN 10204 type 3.1',
      'HFW-CoC-2026-00418',
      'LOT-2026-0517',
      'PO-TWS-55120 / item 3',
      'Tarnbeck Water Services',
      '14 May 2026',
      'PB-88341',
      'HFW-SPEC-FBE-01',
      'Version 3',
      'Sa 2½ (ISO 8501-1)',
      'above dew point',
      'ASTM D5162 method B',
      'No holidays found',
      'MEK rub test',
      'Hot-water soak',
      'NC-2026-031',
      'Recoated and re-inspected',
      data.statement.slice(0, 40),
      'Priya Ashcombe, 13 May 2026',
      'Tomasz Wrenfield, 14 May 2026',
      data.verifyUrl,
    ]) {
      expect(text.all).toContain(expected)
    }
  })

  it('shows the safety caution beside the holiday test voltage (project rule)', () => {
    expect(text.all).toContain('1,900 V')
    expect(text.all).toContain('Caution: high-voltage holiday testers can cause injury')
  })

  it('prints "page x of y" on every page', () => {
    expect(text.pages).toHaveLength(2)
    expect(text.pages[0]).toContain('page 1 of 2')
    expect(text.pages[1]).toContain('page 2 of 2')
  })

  it('prints the content fingerprint of the data on every page, and fingerprints the file bytes', () => {
    const content = contentFingerprint(data)
    expect(content).toMatch(/^[0-9a-f]{64}$/)
    for (const page of text.pages)
      expect(page).toContain(`Content fingerprint (SHA-256) ${content}`)
    expect(certificateFingerprint(pdf)).toBe(createHash('sha256').update(pdf).digest('hex'))
    // The file hash cannot be inside the file it hashes; the content hash is a different number.
    expect(certificateFingerprint(pdf)).not.toBe(content)
  })

  it('embeds Roboto as TrueType and no other font', () => {
    const raw = pdf.toString('latin1')
    expect(raw).toContain('/FontFile2')
    expect(raw).toMatch(/\/FontName \/[A-Z]{6}\+Roboto-Regular/)
    expect(raw).toMatch(/\/FontName \/[A-Z]{6}\+Roboto-Medium/)
    expect(raw).not.toMatch(/\/BaseFont \/(Helvetica|Times|Courier)/)
  })

  it('renders the same bytes for the same data, dated by issuedAt', async () => {
    const again = await renderCertificatePdf(harrowgateCertificate())
    expect(again.equals(pdf)).toBe(true)
    // pdfkit writes the date as an indirect object: "/CreationDate 17 0 R" … "(D:20260514093000Z)"
    expect(pdf.toString('latin1')).toContain('(D:20260514093000Z)')
    const later = await renderCertificatePdf(
      harrowgateCertificate({ issuedAt: '2026-05-15T09:30:00.000Z' }),
    )
    expect(later.equals(pdf)).toBe(false)
  })

  it('carries a QR code on page 1 that decodes to the verification URL', async () => {
    const [page1] = await renderPages(pdf, 110, { first: 1, last: 1 })
    expect(page1).toBeDefined()
    expect(await decodeQr(page1!)).toBe(data.verifyUrl)
  })
})

describe('certificate in mils', async () => {
  const text = await readPdfText(
    await renderCertificatePdf(harrowgateCertificate({ thicknessUnit: 'mil' })),
  )

  it('converts each statistic from µm to mils with 1 decimal (1 mil = 25.4 µm exactly [R])', () => {
    // Worked by hand: 287.4/25.4 = 11.31, 341.6/25.4 = 13.45, 402.2/25.4 = 15.83
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-001',
        'Gate valve body DN150 PN16',
        'H24-7310',
        '1',
        '15',
        '11.3',
        '13.4',
        '15.8',
      ]),
    )
    // 301.0/25.4 = 11.85039 → 11.9, 355.5/25.4 = 13.996 → 14.0, 418.7/25.4 = 16.48 → 16.5
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-002',
        'Flanged tee DN100',
        'H24-7311',
        '2',
        '12',
        '11.9',
        '14.0',
        '16.5',
      ]),
    )
    // 276.2/25.4 = 10.87, 322.9/25.4 = 12.71, 389.5/25.4 = 15.33
    expect(text.all).toMatch(
      rowPattern(['HFW-VB-003', 'Flanged tee DN100', 'H24-7312', '3', '9', '10.9', '12.7', '15.3']),
    )
    expect(text.all).toContain('Min mil Mean mil Max mil')
    expect(text.all).toContain('in mils')
    expect(text.all).not.toMatch(/\b342\b/)
  })
})

describe('contentFingerprint', () => {
  it('depends on the values, not on the order of the keys', () => {
    const data = harrowgateCertificate()
    const reordered = Object.fromEntries(
      Object.entries(data).reverse(),
    ) as unknown as CertificateData
    expect(contentFingerprint(reordered)).toBe(contentFingerprint(data))
    expect(contentFingerprint({ ...data, lotNumber: 'LOT-2026-0518' })).not.toBe(
      contentFingerprint(data),
    )
    const parts = [...data.parts].reverse()
    expect(contentFingerprint({ ...data, parts })).not.toBe(contentFingerprint(data))
  })
})
