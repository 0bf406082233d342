/** EN 10204 type 2.1 without results (TRADE.md §7 [R]), a 40-part lot, optional sections. */
import { describe, expect, it } from 'vitest'
import { renderCertificatePdf } from '../../../server/pdf/certificatePdf'
import { fortyPartCertificate, harrowgateCertificate } from './certificateFixture'
import { readPdfText, rowPattern, withoutFingerprints } from './pdfReading'

describe('EN 10204 type 2.1: a declaration of compliance without results', async () => {
  const data = harrowgateCertificate({ kind: '2.1' })
  const text = await readPdfText(await renderCertificatePdf(data))
  const printed = withoutFingerprints(text.all)

  it('lists the parts but no thickness numbers', () => {
    expect(printed).toContain('EN 10204 type 2.1')
    expect(printed).toMatch(
      rowPattern(['HFW-VB-001', 'Gate valve body DN150 PN16', 'H24-7310', '1']),
    )
    for (const value of [
      '287',
      '342',
      '402',
      '301',
      '356',
      '419',
      '276',
      '323',
      '390',
      '15',
      '12',
    ]) {
      expect(printed).not.toMatch(new RegExp(`\\b${value}\\b`))
    }
    expect(printed).not.toMatch(/\b(Min|Mean|Max)\b/)
  })

  it('leaves out holiday, cure, adhesion, climate and recorded preparation results', () => {
    for (const result of [
      'No holidays found',
      '1,900 V',
      'MEK rub',
      'Hot-water soak',
      'dew point',
      'Grade recorded',
      '62–81',
    ]) {
      expect(printed).not.toContain(result)
    }
    expect(printed).toContain('Sa 2½ (ISO 8501-1)')
    expect(printed).toContain('it carries no test results')
    expect(printed).toContain(data.statement.slice(0, 40))
  })
})

describe('EN 10204 type 2.2: a test report with results', async () => {
  const text = await readPdfText(await renderCertificatePdf(harrowgateCertificate({ kind: '2.2' })))

  it('prints the results like 3.1, without the 3.1 inspection representative', () => {
    expect(text.all).toContain('EN 10204 type 2.2')
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
      ]),
    )
    expect(text.all).toContain('No holidays found')
    expect(text.all).toContain('above dew point')
    expect(text.all).toContain('Approved by')
    expect(text.all).not.toContain('authorised inspection representative')
  })
})

describe('a 40-part lot', async () => {
  const data = fortyPartCertificate()
  const text = await readPdfText(await renderCertificatePdf(data))

  it('flows onto further pages, numbering each "page x of y"', () => {
    const total = text.pages.length
    expect(total).toBeGreaterThanOrEqual(3)
    text.pages.forEach((page, i) => expect(page).toContain(`page ${i + 1} of ${total}`))
    expect(text.all.match(/page \d+ of \d+/g)).toHaveLength(total)
  })

  it('prints every part once, repeating the table header on the next page', () => {
    for (const part of data.parts) {
      expect(text.all.split(`${part.partNumber} `)).toHaveLength(2)
    }
    const headerRow = /Part no\. Description Heat \/ serial no\. Qty n Min/
    const pagesWithHeader = text.pages.filter((p) => headerRow.test(p))
    expect(pagesWithHeader.length).toBeGreaterThanOrEqual(2)
    expect(text.pages[1]).toContain('Parts and dry film thickness, continued')
    expect(text.pages[1]).toContain(`Certificate of conformance ${data.number} — continued`)
    // The last row, worked by hand: 270+39, 330+39, 400+39 µm.
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-040',
        'Gate valve body DN150 PN16',
        'H24-7349',
        '4',
        '13',
        '309',
        '369',
        '439',
      ]),
    )
  })

  it('keeps the statement and the sign-off on one page', () => {
    const statementPage = text.pages.findIndex((p) => p.includes('Statement of conformance'))
    expect(statementPage).toBeGreaterThan(-1)
    expect(text.pages[statementPage]).toContain('Inspection and approval')
  })
})

describe('optional parts of a certificate', async () => {
  it('says which certificate it supersedes and prints the independence note when given', async () => {
    const note =
      'Released by the recorder: this plant lets the recording inspector release small lots.'
    const text = await readPdfText(
      await renderCertificatePdf(
        harrowgateCertificate({ supersedes: 'HFW-CoC-2026-00401', independenceNote: note }),
      ),
    )
    expect(text.all).toContain('Supersedes HFW-CoC-2026-00401')
    expect(text.all).toContain(note)
  })

  it('prints neither when absent, and says so when there is no nonconformance or holiday test', async () => {
    const text = await readPdfText(
      await renderCertificatePdf(
        harrowgateCertificate({ nonconformances: [], holiday: null, cure: [] }),
      ),
    )
    expect(text.all).not.toContain('Supersedes')
    expect(text.all).toContain('No nonconformance was raised on this lot.')
    expect(text.all).not.toContain('Caution: high-voltage')
    expect(text.all).toMatch(/Holiday test\s+Not applicable/)
  })

  it('prints a part without readings with dashes, not zeros', async () => {
    const base = harrowgateCertificate()
    const parts = base.parts.map((p, i) =>
      i === 1 ? { ...p, thickness: null, verdict: 'Incomplete' } : p,
    )
    const text = await readPdfText(await renderCertificatePdf({ ...base, parts }))
    expect(text.all).toMatch(
      rowPattern([
        'HFW-VB-002',
        'Flanged tee DN100',
        'H24-7311',
        '2',
        '—',
        '—',
        '—',
        '—',
        'Incomplete',
      ]),
    )
  })

  it('refuses an issue date that is not a date', async () => {
    await expect(renderCertificatePdf(harrowgateCertificate({ issuedAt: 'soon' }))).rejects.toThrow(
      /issuedAt/,
    )
  })
})
