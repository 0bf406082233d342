/**
 * Written after all content, on every buffered page: the teal band with "Filmtrail", the
 * content fingerprint and "page x of y" (the total is only known at the end).
 */
import type { CertificateData } from '../../../shared/api/certificates'
import { FONT } from '../fonts'
import { COLOUR, CONTENT_WIDTH_PT, PAGE, SIZE } from '../theme'

function drawBand(doc: PDFKit.PDFDocument): void {
  doc.rect(0, 0, PAGE.bandWidthPt, PAGE.heightPt).fill(COLOUR.band)
  // Reads bottom to top, near the foot of the band.
  const x = PAGE.bandWidthPt / 2 + 2.6
  const y = PAGE.heightPt - 40
  doc.save()
  doc.rotate(-90, { origin: [x, y] })
  doc
    .font(FONT.medium)
    .fontSize(7.5)
    .fillColor(COLOUR.bandText)
    .text('Filmtrail', x, y, { lineBreak: false, characterSpacing: 1.2 })
  doc.restore()
}

export function drawFooters(
  doc: PDFKit.PDFDocument,
  data: CertificateData,
  contentFingerprintHex: string,
): void {
  const { start, count } = doc.bufferedPageRange()
  const left = PAGE.contentLeftPt
  for (let i = start; i < start + count; i++) {
    doc.switchToPage(i)
    drawBand(doc)
    const top = PAGE.footerTopPt
    doc
      .moveTo(left, top)
      .lineTo(PAGE.contentRightPt, top)
      .lineWidth(0.5)
      .strokeColor(COLOUR.rule)
      .stroke()
    doc
      .font(FONT.medium)
      .fontSize(SIZE.footer)
      .fillColor(COLOUR.ink)
      // One line whatever the plant's name: a second would run into the fingerprint.
      .text(`Certificate ${data.number}   ·   ${data.issuer.name}`, left, top + 7, {
        width: CONTENT_WIDTH_PT - 90,
        height: SIZE.footer * 1.4,
        ellipsis: true,
      })
    doc
      .font(FONT.medium)
      .fontSize(SIZE.footer + 0.7)
      .text(`page ${i - start + 1} of ${count}`, PAGE.contentRightPt - 80, top + 7, {
        width: 80,
        align: 'right',
        lineBreak: false,
      })
    doc
      .font(FONT.regular)
      .fontSize(SIZE.footer - 0.4)
      .fillColor(COLOUR.muted)
      .text(`Content fingerprint (SHA-256)   ${contentFingerprintHex}`, left, top + 18, {
        width: CONTENT_WIDTH_PT,
        lineBreak: false,
      })
  }
}
