/**
 * A process-wide memo of fontkit's layout(text, features), shared by every certificate.
 *
 * pdfkit keeps a layout cache per document only, so without this each certificate lays out its
 * words afresh (~0.5–1 ms each, hundreds per page). pdfkit scales the returned positions IN
 * PLACE, so every call gets fresh copies of the position objects; glyph objects are only read
 * and can be shared. The memo is cleared when it grows past MAX_ENTRIES to bound memory.
 *
 * Words with a digit in them (certificate, lot and part numbers, readings, the fingerprint) are
 * new on nearly every certificate, and one fontkit layout costs ~0.5 ms. Such words made of
 * plain Latin letters, digits and the usual separators are put together from the memoised
 * layouts of their single characters: identical glyphs, without kerning between them, the way
 * figures are set in tables anyway.
 */

interface Position {
  xAdvance: number
  [key: string]: number
}

interface Run {
  glyphs: unknown[]
  positions: Position[]
  readonly advanceWidth: number
}

export interface LayoutFont {
  layout: (text: string, features?: unknown) => Run
}

const MAX_ENTRIES = 20_000

/** A word with a digit, of characters whose glyphs do not change with their neighbours. */
const IDENTIFIER = /^(?=.*[0-9])[0-9A-Za-z.,:;/#+\-()_ ]+$/

/** Replaces font.layout on this one parsed font object with a memoised version; returns it. */
export function memoiseLayout<F extends LayoutFont>(font: F): F {
  const original = font.layout.bind(font)
  const memo = new Map<string, { glyphs: unknown[]; positions: Position[] }>()
  type Entry = { glyphs: unknown[]; positions: Position[] }
  const lookUp = (text: string, features?: unknown): Entry => {
    const key = features ? `${JSON.stringify(features)}\u0000${text}` : text
    let entry = memo.get(key)
    if (!entry) {
      entry =
        !features && text.length > 1 && IDENTIFIER.test(text)
          ? compose(text)
          : shape(text, features)
      if (memo.size >= MAX_ENTRIES) memo.clear()
      memo.set(key, entry)
    }
    return entry
  }
  const shape = (text: string, features?: unknown): Entry => {
    const run = original(text, features)
    return { glyphs: run.glyphs, positions: run.positions.map((p) => ({ ...p })) }
  }
  const compose = (text: string): Entry => {
    const entry: Entry = { glyphs: [], positions: [] }
    for (const char of text) {
      const one = lookUp(char)
      entry.glyphs.push(...one.glyphs)
      entry.positions.push(...one.positions.map((p) => ({ ...p })))
    }
    return entry
  }
  font.layout = (text: string, features?: unknown): Run => {
    const entry = lookUp(text, features)
    return freshRun(entry.glyphs, entry.positions)
  }
  return font
}

function freshRun(glyphs: unknown[], positions: Position[]): Run {
  const copies = positions.map((p) => ({ ...p }))
  return {
    glyphs,
    positions: copies,
    // Like fontkit's GlyphRun: summed from the positions, so it follows pdfkit's scaling.
    get advanceWidth() {
      let width = 0
      for (const p of copies) width += p.xAdvance
      return width
    },
  }
}
