/** Page 1's top: the plant as issuer, the title and EN 10204 type, the QR code, the key facts. */
import { CERTIFICATE_KIND_LABELS, type CertificateData } from '../../../shared/api/certificates'
import { FONT } from '../fonts'
import { formatDate } from '../format'
import type { Sheet } from '../layout'
import { drawQrCode } from '../qr'
import { COLOUR, SIZE, SPACE } from '../theme'

const QR_SIZE_PT = 70
const QR_COLUMN_PT = 176
const KEY_FACT_PT = 10.5

function issuerAndTitle(sheet: Sheet, data: CertificateData, width: number): number {
  const { doc } = sheet
  let y = sheet.y
  doc.font(FONT.medium).fontSize(SIZE.issuerName).fillColor(COLOUR.ink)
  doc.text(data.issuer.name, sheet.left, y, { width })
  y = doc.y + 1
  doc.font(FONT.regular).fontSize(SIZE.address).fillColor(COLOUR.muted)
  doc.text(data.issuer.address, sheet.left, y, { width })
  y = doc.y + 18
  doc.font(FONT.medium).fontSize(SIZE.title).fillColor(COLOUR.ink)
  doc.text('Certificate of conformance', sheet.left, y, { width })
  y = doc.y + 2
  doc.font(FONT.regular).fontSize(SIZE.kind).fillColor(COLOUR.accent)
  doc.text(CERTIFICATE_KIND_LABELS[data.kind], sheet.left, y, { width })
  y = doc.y
  if (data.supersedes) {
    y += 6
    doc.font(FONT.medium).fontSize(SIZE.kind).fillColor(COLOUR.notice)
    doc.text(`Supersedes ${data.supersedes}`, sheet.left, y, { width })
    y = doc.y
  }
  return y
}

function verifyBlock(sheet: Sheet, data: CertificateData): number {
  const { doc } = sheet
  const x = sheet.right - QR_COLUMN_PT
  // The dark area lines up with the text's right edge; its quiet zone lies in the white around.
  drawQrCode(doc, data.verifyUrl, sheet.right - QR_SIZE_PT, sheet.y + 2, QR_SIZE_PT)
  let y = sheet.y + 2 + QR_SIZE_PT + 8
  y += sheet.label('Scan or open to check validity', x, y, QR_COLUMN_PT, 'right') + 1
  doc.font(FONT.regular).fillColor(COLOUR.ink)
  // Printed for typing in: one line when it fits (shrinking a little), else broken after a '/'.
  const { lines, sizePt } = fitUrl(doc, data.verifyUrl, QR_COLUMN_PT)
  doc.fontSize(sizePt)
  for (const line of lines) {
    sheet.textInBox(line, x, y, QR_COLUMN_PT, { align: 'right' })
    y += sizePt * 1.25
  }
  doc.font(FONT.regular).fontSize(FINGERPRINT_NOTE_PT).fillColor(COLOUR.muted)
  doc.text(FINGERPRINT_NOTE, x, y + 2, { width: QR_COLUMN_PT, align: 'right' })
  return doc.y
}

/** Which fingerprint is which (fingerprint.ts): the file cannot carry its own hash. */
const FINGERPRINT_NOTE =
  'That page shows whether the certificate is valid, the SHA-256 of this PDF file and the ' +
  'content fingerprint printed in the footer.'
const FINGERPRINT_NOTE_PT = 6.2

const URL_SIZES_PT = [7.2, 6.8, 6.4]

export function fitUrl(doc: PDFKit.PDFDocument, url: string, widthPt: number) {
  for (const sizePt of URL_SIZES_PT) {
    doc.fontSize(sizePt)
    if (doc.widthOfString(url) <= widthPt) return { lines: [url], sizePt }
  }
  const sizePt = URL_SIZES_PT[URL_SIZES_PT.length - 1] ?? 6.4
  doc.fontSize(sizePt)
  const lines: string[] = []
  let line = ''
  for (const piece of url.split(/(?<=\/)/)) {
    if (line && doc.widthOfString(line + piece) > widthPt) {
      lines.push(line)
      line = ''
    }
    line += piece
  }
  if (line) lines.push(line)
  return { lines, sizePt }
}

/** Certificate number, issue date, lot and order on a light tint: what a goods-in clerk files by. */
function keyFacts(sheet: Sheet, data: CertificateData): void {
  const { doc } = sheet
  const facts: [string, string][] = [
    ['Certificate no.', data.number],
    ['Issued', formatDate(data.issuedAt)],
    ['Lot number', data.lotNumber],
    ['Order reference', data.orderRef],
  ]
  const padPt = 10
  const free = sheet.width - 2 * padPt - SPACE.columnGapPt * 3
  // Numbers and references are long, the date is short.
  const widths = [0.3, 0.18, 0.24, 0.28].map((share) => share * free)
  const valueHeights = facts.map(([, value], i) =>
    sheet.textHeight(value, FONT.medium, KEY_FACT_PT, widths[i] ?? 0),
  )
  const heightPt = 2 * padPt + SIZE.label + 4 + Math.max(...valueHeights)
  doc.rect(sheet.left, sheet.y, sheet.width, heightPt).fill(COLOUR.tint)
  doc.rect(sheet.left, sheet.y, 2.5, heightPt).fill(COLOUR.accent)
  let x = sheet.left + padPt
  facts.forEach(([label, value], i) => {
    const width = widths[i] ?? 0
    sheet.label(label, x, sheet.y + padPt, width)
    doc.font(FONT.medium).fontSize(KEY_FACT_PT).fillColor(COLOUR.ink)
    doc.text(value, x, sheet.y + padPt + SIZE.label + 4, { width })
    x += width + SPACE.columnGapPt
  })
  sheet.y += heightPt
}

export function drawHeader(sheet: Sheet, data: CertificateData): void {
  const leftBottom = issuerAndTitle(sheet, data, sheet.width - QR_COLUMN_PT - SPACE.columnGapPt)
  const rightBottom = verifyBlock(sheet, data)
  sheet.y = Math.max(leftBottom, rightBottom) + 14
  keyFacts(sheet, data)
  sheet.gap(SPACE.sectionGapPt + 2)
}
