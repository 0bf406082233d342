/**
 * A table with light rules that flows onto further pages, repeating its header row there.
 * Cells wrap; a row is never split across pages.
 */
import { FONT } from './fonts'
import type { Sheet } from './layout'
import { COLOUR, SIZE, SMALL_CAPS, SPACE } from './theme'

export interface Column {
  title: string
  /** Share of the table width; the shares are normalised, so any consistent scale works. */
  weight: number
  align?: 'left' | 'right'
}

export interface TableRow {
  cells: string[]
  /** Medium weight for the first cell (the part number a reader looks up). */
  strongFirst?: boolean
}

interface Placed {
  x: number
  width: number
  column: Column
}

const PAD_X = SPACE.cellPadXPt
const PAD_Y = SPACE.cellPadYPt

function place(sheet: Sheet, columns: Column[]): Placed[] {
  const total = columns.reduce((sum, c) => sum + c.weight, 0)
  let x = sheet.left
  return columns.map((column) => {
    const width = (sheet.width * column.weight) / total
    const placed = { x, width, column }
    x += width
    return placed
  })
}

function headerHeight(sheet: Sheet, placed: Placed[]): number {
  const textPt = Math.max(
    ...placed.map((p) =>
      sheet.textHeight(p.column.title, FONT.medium, SIZE.tableHead, p.width - 2 * PAD_X, true),
    ),
  )
  return textPt + 2 * PAD_Y
}

function rowHeight(sheet: Sheet, placed: Placed[], row: TableRow): number {
  const textPt = Math.max(
    ...placed.map((p, i) => {
      const font = i === 0 && row.strongFirst ? FONT.medium : FONT.regular
      return sheet.textHeight(row.cells[i] || ' ', font, SIZE.table, p.width - 2 * PAD_X)
    }),
  )
  return textPt + 2 * PAD_Y
}

function drawHeader(sheet: Sheet, placed: Placed[], heightPt: number): void {
  const { doc } = sheet
  doc.rect(sheet.left, sheet.y, sheet.width, heightPt).fill(COLOUR.tint)
  for (const p of placed) {
    doc.font(FONT.medium).fontSize(SIZE.tableHead).fillColor(COLOUR.muted)
    sheet.textInBox(p.column.title, p.x + PAD_X, sheet.y + PAD_Y, p.width - 2 * PAD_X, {
      align: p.column.align ?? 'left',
      features: SMALL_CAPS,
    })
  }
  sheet.y += heightPt
}

/**
 * Draws the table from the cursor; the header row is never left without a row under it. On a
 * new page the table starts again with continuedTitle (as a section heading) and its header.
 */
export function drawTable(
  sheet: Sheet,
  columns: Column[],
  rows: TableRow[],
  continuedTitle?: string,
): void {
  const placed = place(sheet, columns)
  const headerPt = headerHeight(sheet, placed)
  const heights = rows.map((row) => rowHeight(sheet, placed, row))
  sheet.ensureSpace(headerPt + (heights[0] ?? 0))
  drawHeader(sheet, placed, headerPt)
  rows.forEach((row, index) => {
    const heightPt = heights[index] ?? 0
    if (sheet.ensureSpace(heightPt)) {
      if (continuedTitle) sheet.heading(continuedTitle, headerPt + heightPt)
      drawHeader(sheet, placed, headerPt)
    }
    placed.forEach((p, i) => {
      sheet.doc
        .font(i === 0 && row.strongFirst ? FONT.medium : FONT.regular)
        .fontSize(SIZE.table)
        .fillColor(COLOUR.ink)
      sheet.textInBox(row.cells[i] ?? '', p.x + PAD_X, sheet.y + PAD_Y, p.width - 2 * PAD_X, {
        align: p.column.align ?? 'left',
      })
    })
    sheet.y += heightPt
    sheet.rule(sheet.y)
  })
}

/** Height of the header plus the first row: what a heading above the table keeps with it. */
export function tableLeadHeight(sheet: Sheet, columns: Column[], rows: TableRow[]): number {
  const placed = place(sheet, columns)
  const first = rows[0]
  return headerHeight(sheet, placed) + (first ? rowHeight(sheet, placed, first) : 0)
}
