/**
 * The QR code to the public verification page, drawn as vector squares: sharp at any zoom or
 * print size, no PNG to encode and decode, and the same bytes every time.
 */
import QRCode from 'qrcode'
import { COLOUR } from './theme'

/** Modules of white kept around the symbol; the QR specification asks for 4. */
const QUIET_ZONE_MODULES = 4

/**
 * Draws the symbol's dark area with its top-left corner at (x, y), sizePt wide, and paints the
 * white quiet zone around it (outside that box). Error correction M (15 %) survives a crease or
 * a smudge on a printed certificate.
 */
export function drawQrCode(
  doc: PDFKit.PDFDocument,
  text: string,
  x: number,
  y: number,
  sizePt: number,
): void {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' })
  const count = modules.size
  const modulePt = sizePt / count
  const quietPt = QUIET_ZONE_MODULES * modulePt
  const originX = x
  const originY = y
  doc.save()
  doc.rect(x - quietPt, y - quietPt, sizePt + 2 * quietPt, sizePt + 2 * quietPt).fill('#FFFFFF')
  // One rectangle per horizontal run of dark modules keeps the content stream short.
  for (let row = 0; row < count; row++) {
    let col = 0
    while (col < count) {
      if (!modules.get(row, col)) {
        col++
        continue
      }
      const start = col
      while (col < count && modules.get(row, col)) col++
      // A hair of overlap hides the anti-aliasing seams between neighbouring rows.
      doc.rect(
        originX + start * modulePt,
        originY + row * modulePt,
        (col - start) * modulePt,
        modulePt + 0.05,
      )
    }
  }
  doc.fill(COLOUR.ink)
  doc.restore()
}
