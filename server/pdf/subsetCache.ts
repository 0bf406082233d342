/**
 * Embedding a font means encoding a subset of its glyphs (fontkit re-encodes every glyph and
 * rebuilds the tables), about a third of a certificate's render time. The encoded subset is a
 * pure function of the list of glyphs in it, so it is memoised per process by that list.
 *
 * To make the list the same from one certificate to the next, every document first takes a
 * fixed set of glyphs in a fixed order (seedCommonGlyphs): the printable ASCII range and the
 * symbols certificates use. A certificate whose text stays inside that set (nearly all) reuses
 * the encoded subset; any other character is appended after the seed and costs one encoding.
 * The price is a slightly larger file (the unused seed glyphs are embedded too).
 */

interface Subset {
  glyphs: number[]
  encode: () => Uint8Array
}

export interface SubsetFont {
  createSubset: () => Subset
}

const MAX_ENTRIES = 64

/** Replaces font.createSubset on this one parsed font object so encode() is memoised. */
export function memoiseSubsets<F extends SubsetFont>(font: F): F {
  const create = font.createSubset.bind(font)
  const memo = new Map<string, Uint8Array>()
  font.createSubset = (): Subset => {
    const subset = create()
    const encode = subset.encode.bind(subset)
    subset.encode = () => {
      // Read the key before encoding: encode() appends the components of compound glyphs.
      const key = subset.glyphs.join(',')
      let bytes = memo.get(key)
      if (!bytes) {
        bytes = encode()
        if (memo.size >= MAX_ENTRIES) memo.clear()
        memo.set(key, bytes)
      }
      return bytes
    }
    return subset
  }
  return font
}

const ASCII = Array.from({ length: 0x7e - 0x20 + 1 }, (_, i) => String.fromCharCode(0x20 + i)).join(
  '',
)
/** Beyond ASCII: what units, grades, dashes, quotes and lists on a certificate use. */
const SYMBOLS = '°µ½–—‘’“”•·×±≤≥Δ…'
export const SEED_TEXT = ASCII + SYMBOLS
/** Labels are set in small capitals, which are glyphs of their own. */
export const SEED_SMALL_CAPS_TEXT = 'abcdefghijklmnopqrstuvwxyz().'

/**
 * pdfkit's EmbeddedFont.encode() adds glyphs to the document's subset (with their widths and
 * Unicode mapping) without drawing anything. It is not in pdfkit's typings; pdfkit is pinned
 * (0.20.2) and the seed is skipped if the method is ever missing, which only costs speed.
 */
export function seedCommonGlyphs(
  doc: PDFKit.PDFDocument,
  fontName: string,
  smallCaps: boolean,
): void {
  doc.font(fontName)
  const font = (
    doc as unknown as { _font?: { encode?: (text: string, features?: string[]) => unknown } }
  )._font
  if (typeof font?.encode !== 'function') return
  font.encode(SEED_TEXT)
  if (smallCaps) font.encode(SEED_SMALL_CAPS_TEXT, ['smcp'])
}
