/**
 * Roboto TTF fonts for pdfkit (pdfkit embeds TTF/OTF only; @expo-google-fonts/roboto ships .ttf).
 *
 * Speed: fontkit needs ~35 ms to parse a face and read its layout tables, and ~0.5–1 ms to lay
 * out each word (kerning, ligatures). pdfkit would redo both for every document, so each face is
 * parsed ONCE per process with pdfkit's own fontkit, and its layout() is memoised across
 * documents (layoutCache.ts), and so is the encoding of its embedded subset (subsetCache.ts).
 * pdfkit accepts such a parsed font (anything with layout()) and still builds a glyph subset per
 * document.
 */
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { memoiseLayout, type LayoutFont } from './layoutCache'
import { memoiseSubsets, seedCommonGlyphs, type SubsetFont } from './subsetCache'

const require = createRequire(import.meta.url)

export const FONT = { regular: 'Roboto-Regular', medium: 'Roboto-Medium' } as const
type FontName = (typeof FONT)[keyof typeof FONT]

const FONT_FILES: Record<FontName, string> = {
  'Roboto-Regular': '@expo-google-fonts/roboto/400Regular/Roboto_400Regular.ttf',
  'Roboto-Medium': '@expo-google-fonts/roboto/500Medium/Roboto_500Medium.ttf',
}

type ParsedFont = LayoutFont & SubsetFont

let parsed: Map<FontName, ParsedFont> | null = null

function loadFonts(): Map<FontName, ParsedFont> {
  // pdfkit's own fontkit, so the object is exactly what pdfkit would have built from the buffer.
  const fontkit = createRequire(require.resolve('pdfkit'))('fontkit') as {
    create: (buffer: Uint8Array) => ParsedFont
  }
  const fonts = new Map<FontName, ParsedFont>()
  for (const [name, file] of Object.entries(FONT_FILES) as [FontName, string][]) {
    const font = memoiseSubsets(memoiseLayout(fontkit.create(readFileSync(fontFilePath(file)))))
    // Read the layout tables now rather than inside the first certificate's timing.
    font.layout('Certificate 0123456789 µm')
    fonts.set(name, font)
  }
  return fonts
}

function fontFilePath(file: string): string {
  return require.resolve(file)
}

/** Parses the faces now (~100–300 ms once), e.g. at server start, not inside the first request. */
export function preloadCertificateFonts(): void {
  parsed ??= loadFonts()
}

/**
 * Registers the cached faces on one document under the FONT names and seeds each subset with
 * the common glyphs (subsetCache.ts). Leaves the regular face selected.
 */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  parsed ??= loadFonts()
  // pdfkit's types only list buffers and paths as sources; a parsed font is accepted at run time.
  for (const [name, font] of parsed) doc.registerFont(name, font as unknown as Buffer)
  // Fixed order: the subsets, their tags and so the bytes stay the same for the same data.
  seedCommonGlyphs(doc, FONT.regular, false)
  seedCommonGlyphs(doc, FONT.medium, true)
  doc.font(FONT.regular)
}

/** File paths of the faces, for tests and tools that want the original TTF. */
export function fontFilePaths(): Record<FontName, string> {
  return {
    'Roboto-Regular': fontFilePath(FONT_FILES['Roboto-Regular']),
    'Roboto-Medium': fontFilePath(FONT_FILES['Roboto-Medium']),
  }
}
