/**
 * The certificate of conformance as a PDF: a pure function of CertificateData.
 *
 *   renderCertificatePdf(data)   → the PDF bytes (deterministic: same data, same bytes)
 *   certificateFingerprint(pdf)  → SHA-256 of those bytes (stored by the server, shown on the
 *                                  verification page; cannot be printed inside the file itself)
 *   contentFingerprint(data)     → SHA-256 of the canonical data JSON, printed in every footer
 *
 *   preloadCertificateFonts()    → parse the fonts ahead of the first certificate (optional)
 *
 * Speed: fonts are parsed once per process and their layouts and embedded subsets are memoised
 * across documents (fonts.ts, layoutCache.ts, subsetCache.ts); none of that changes the bytes.
 *
 * EN 10204 (TRADE.md §7 [R]): type 2.1 is a declaration of compliance without results, so it
 * prints no thickness numbers, no holiday/cure/adhesion results and no climate; 2.2 and 3.1 do.
 */
import PDFDocument from 'pdfkit'
import type { CertificateData } from '../../shared/api/certificates'
import { contentFingerprint } from './fingerprint'
import { FONT, registerFonts } from './fonts'
import { issuedAtDate } from './format'
import { Sheet } from './layout'
import { drawNonconformances, drawStatementAndSignOff } from './sections/closing'
import { drawFooters } from './sections/footer'
import { drawHeader } from './sections/header'
import { drawCoatingAndSpec, drawCustomerAndLot, drawPreparationAndClimate } from './sections/lot'
import { drawCureAndAdhesion, drawHoliday, drawParts } from './sections/results'
import { PAGE } from './theme'

export { certificateFingerprint, contentFingerprint, canonicalJson } from './fingerprint'
export { preloadCertificateFonts } from './fonts'

function createDocument(data: CertificateData): PDFKit.PDFDocument {
  const issuedAt = issuedAtDate(data.issuedAt)
  return new PDFDocument({
    size: [PAGE.widthPt, PAGE.heightPt],
    // Zero margins: the layout decides every page break (see layout.ts).
    margins: { top: 0, bottom: 0, left: 0, right: 0 },
    bufferPages: true,
    // No default Helvetica: only the embedded Roboto faces end up in the file.
    font: null as unknown as string,
    // pdfkit derives the file /ID from this dictionary, so fixing CreationDate (and leaving out
    // ModDate) makes the bytes depend on the data alone.
    info: {
      Title: `Certificate of conformance ${data.number}`,
      Subject: `EN 10204 type ${data.kind}, lot ${data.lotNumber}`,
      Author: data.issuer.name,
      Creator: 'Filmtrail',
      Producer: 'Filmtrail',
      CreationDate: issuedAt,
    },
    lang: 'en',
    displayTitle: true,
  })
}

function collect(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    doc.on('data', (chunk: Buffer) => chunks.push(chunk))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
}

export async function renderCertificatePdf(data: CertificateData): Promise<Buffer> {
  const doc = createDocument(data)
  const bytes = collect(doc)
  registerFonts(doc)
  doc.font(FONT.regular)
  const sheet = new Sheet(doc, `Certificate of conformance ${data.number} — continued`)
  drawHeader(sheet, data)
  drawCustomerAndLot(sheet, data)
  drawCoatingAndSpec(sheet, data)
  drawPreparationAndClimate(sheet, data)
  drawParts(sheet, data)
  if (data.kind !== '2.1') {
    drawHoliday(sheet, data)
    drawCureAndAdhesion(sheet, data)
  }
  drawNonconformances(sheet, data)
  drawStatementAndSignOff(sheet, data)
  drawFooters(doc, data, contentFingerprint(data))
  doc.end()
  return await bytes
}
