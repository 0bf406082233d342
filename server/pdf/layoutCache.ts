/**
 * A process-wide memo of fontkit's layout(text, features), shared by every certificate.
 *
 * pdfkit keeps a layout cache per document only, so without this each certificate lays out its
 * words afresh (~0.5–1 ms each, hundreds per page). pdfkit scales the returned positions IN
 * PLACE, so every call gets fresh copies of the position objects; glyph objects are only read
 * and can be shared. The memo is cleared when it grows past MAX_ENTRIES to bound memory.
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

/** Replaces font.layout on this one parsed font object with a memoised version; returns it. */
export function memoiseLayout<F extends LayoutFont>(font: F): F {
  const original = font.layout.bind(font)
  const memo = new Map<string, { glyphs: unknown[]; positions: Position[] }>()
  font.layout = (text: string, features?: unknown): Run => {
    const key = features ? `${JSON.stringify(features)}\u0000${text}` : text
    let entry = memo.get(key)
    if (!entry) {
      const run = original(text, features)
      entry = { glyphs: run.glyphs, positions: run.positions.map((p) => ({ ...p })) }
      if (memo.size >= MAX_ENTRIES) memo.clear()
      memo.set(key, entry)
    }
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
