/** Reading a rendered certificate back: its text per page (pdf-parse) and page images (pdftoppm). */
import { execFile } from 'node:child_process'
import { existsSync } from 'node:fs'
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import jsQR from 'jsqr'
import { PDFParse } from 'pdf-parse'
import sharp from 'sharp'

const run = promisify(execFile)
export const PDFTOPPM = '/usr/bin/pdftoppm'

export interface PdfText {
  pages: string[]
  all: string
}

export async function readPdfText(pdf: Buffer): Promise<PdfText> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) })
  try {
    const result = await parser.getText()
    const pages = result.pages.sort((a, b) => a.num - b.num).map((p) => p.text)
    return { pages, all: pages.join('\n') }
  } finally {
    await parser.destroy()
  }
}

/** PNG files of the pages at `dpi`, in page order. Needs poppler-utils (apt-get install -y poppler-utils). */
export async function renderPages(
  pdf: Buffer,
  dpi: number,
  pages?: { first: number; last: number },
): Promise<Buffer[]> {
  if (!existsSync(PDFTOPPM)) throw new Error('pdftoppm missing: apt-get install -y poppler-utils')
  const dir = await mkdtemp(join(tmpdir(), 'filmtrail-pdf-'))
  try {
    await writeFile(join(dir, 'in.pdf'), pdf)
    const range = pages ? ['-f', String(pages.first), '-l', String(pages.last)] : []
    await run(PDFTOPPM, [
      '-png',
      '-r',
      String(dpi),
      ...range,
      join(dir, 'in.pdf'),
      join(dir, 'page'),
    ])
    const files = (await readdir(dir)).filter((f) => f.endsWith('.png')).sort()
    return await Promise.all(files.map((f) => readFile(join(dir, f))))
  } finally {
    await rm(dir, { recursive: true, force: true })
  }
}

/** The text of the first QR code jsQR finds in a PNG, or null. */
export async function decodeQr(png: Buffer): Promise<string | null> {
  const { data, info } = await sharp(png).ensureAlpha().raw().toBuffer({ resolveWithObject: true })
  const code = jsQR(
    new Uint8ClampedArray(data.buffer, data.byteOffset, data.length),
    info.width,
    info.height,
  )
  return code?.data ?? null
}

/** pdf-parse gives the micro sign back as Greek mu (Roboto draws both with one glyph). */
export const MICRO = '[µμ]'

/** One table row as pdf-parse reads it: the cells in order, separated by single spaces. */
export function rowPattern(cells: string[]): RegExp {
  return new RegExp(cells.map((c) => c.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')).join(' '))
}

/** The footer carries a 64-digit hex fingerprint; digits in it must not count as printed values. */
export function withoutFingerprints(text: string): string {
  return text.replace(/[0-9a-f]{64}/g, '')
}
