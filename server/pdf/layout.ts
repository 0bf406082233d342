/**
 * The writing cursor and the few building blocks every section uses: section headings, label +
 * value fields in a grid, paragraphs. Page breaks are decided here, never by pdfkit: pages have
 * zero margins so pdfkit never adds a page on its own, and the footer can be written afterwards.
 */
import { FONT } from './fonts'
import { COLOUR, CONTENT_WIDTH_PT, PAGE, SIZE, SMALL_CAPS, SPACE } from './theme'

export interface Field {
  label: string
  value: string
  /** Columns this field spans in its grid (default 1). */
  span?: number
  /** Medium weight, for the values a reader looks for first. */
  strong?: boolean
}

const LABEL_SPACING_PT = 0.3

/** One line, no line feed, narrower than width: no wrapping needed. */
function fitsOneLine(
  doc: PDFKit.PDFDocument,
  text: string,
  width: number,
  features?: PDFKit.Mixins.OpenTypeFeatures[],
  characterSpacing?: number,
): boolean {
  return !text.includes('\n') && doc.widthOfString(text, { features, characterSpacing }) <= width
}

/** Height a section heading takes, including its gap to the content. */
export const HEADING_PT = SIZE.heading + SPACE.headingGapPt + 4

export class Sheet {
  y: number = PAGE.contentTopPt
  readonly left: number = PAGE.contentLeftPt
  readonly width: number = CONTENT_WIDTH_PT

  constructor(
    readonly doc: PDFKit.PDFDocument,
    /** Printed at the top of pages 2+, so a loose page still says what it belongs to. */
    private readonly continuationTitle: string,
  ) {}

  get right(): number {
    return this.left + this.width
  }

  /** Starts a new page when heightPt does not fit below the cursor; true when it did. */
  ensureSpace(heightPt: number): boolean {
    if (this.y + heightPt <= PAGE.contentBottomPt) return false
    this.newPage()
    return true
  }

  newPage(): void {
    this.doc.addPage()
    this.y = PAGE.contentTopPt
    this.doc
      .font(FONT.medium)
      .fontSize(SIZE.small)
      .fillColor(COLOUR.muted)
      .text(this.continuationTitle, this.left, this.y, { width: this.width, lineBreak: false })
    this.y += 12
    this.rule(this.y)
    this.y += 14
  }

  rule(y: number, colour: string = COLOUR.rule, x1 = this.left, x2 = this.right): void {
    this.doc.moveTo(x1, y).lineTo(x2, y).lineWidth(0.5).strokeColor(colour).stroke()
  }

  /**
   * Height of text wrapped to width. Most values are one short line: measuring those by width
   * skips pdfkit's line wrapper, which is most of the time a certificate takes to lay out.
   */
  textHeight(text: string, font: string, size: number, width: number, small = false): number {
    const features = small ? SMALL_CAPS : undefined
    this.doc.font(font).fontSize(size)
    if (fitsOneLine(this.doc, text, width, features)) return this.doc.currentLineHeight(true)
    return this.doc.heightOfString(text, { width, features })
  }

  /**
   * Writes text in a box width wide; the same result as doc.text(text, x, y, { width, align }),
   * without the line wrapper when the text fits on one line. Font and size must be set already.
   */
  textInBox(
    text: string,
    x: number,
    y: number,
    width: number,
    options: {
      align?: 'left' | 'right'
      features?: PDFKit.Mixins.OpenTypeFeatures[]
      characterSpacing?: number
    } = {},
  ): void {
    const { align = 'left', features, characterSpacing } = options
    if (fitsOneLine(this.doc, text, width, features, characterSpacing)) {
      const textWidth = this.doc.widthOfString(text, { features, characterSpacing })
      const left = align === 'right' ? x + width - textWidth : x
      this.doc.text(text, left, y, { lineBreak: false, features, characterSpacing })
    } else {
      this.doc.text(text, x, y, { width, align, features, characterSpacing })
    }
  }

  /** A small-caps label; the text is given in sentence case and set in the font's small capitals. */
  label(
    text: string,
    x: number,
    y: number,
    width: number,
    align: 'left' | 'right' = 'left',
  ): number {
    this.doc.font(FONT.medium).fontSize(SIZE.label).fillColor(COLOUR.muted)
    this.textInBox(text, x, y, width, {
      align,
      features: SMALL_CAPS,
      characterSpacing: LABEL_SPACING_PT,
    })
    return this.textHeight(text, FONT.medium, SIZE.label, width, true)
  }

  /** A section title with a hairline running to the right edge; keeps keepWithPt on its page. */
  heading(title: string, keepWithPt: number): void {
    this.ensureSpace(HEADING_PT + keepWithPt)
    const { doc } = this
    doc.font(FONT.medium).fontSize(SIZE.heading).fillColor(COLOUR.accent)
    const options = { features: SMALL_CAPS, characterSpacing: 0.6, lineBreak: false }
    const titleWidth = doc.widthOfString(title, options)
    doc.text(title, this.left, this.y, options)
    this.rule(this.y + SIZE.heading * 0.62, COLOUR.rule, this.left + titleWidth + 8, this.right)
    this.y += HEADING_PT
  }

  /** Height a field grid will take, so a caller can keep it together with its heading. */
  gridHeight(fields: Field[], columns: number): number {
    return this.gridRows(fields, columns).reduce((sum, row) => sum + row.heightPt, 0)
  }

  /** Label-over-value fields, left to right in `columns` equal columns, wrapping long values. */
  grid(fields: Field[], columns: number): void {
    for (const row of this.gridRows(fields, columns)) {
      this.ensureSpace(row.heightPt)
      for (const cell of row.cells) {
        this.label(cell.field.label, cell.x, this.y, cell.width)
        this.doc
          .font(cell.field.strong ? FONT.medium : FONT.regular)
          .fontSize(SIZE.value)
          .fillColor(COLOUR.ink)
        this.textInBox(
          cell.field.value,
          cell.x,
          this.y + SIZE.label + 2 + SPACE.labelGapPt,
          cell.width,
        )
      }
      this.y += row.heightPt
    }
  }

  private gridRows(fields: Field[], columns: number) {
    const columnWidth = (this.width - SPACE.columnGapPt * (columns - 1)) / columns
    const rows: { heightPt: number; cells: { field: Field; x: number; width: number }[] }[] = []
    let current: (typeof rows)[number] = { heightPt: 0, cells: [] }
    let used = 0
    for (const field of fields) {
      const span = Math.min(field.span ?? 1, columns)
      if (used + span > columns) {
        rows.push(current)
        current = { heightPt: 0, cells: [] }
        used = 0
      }
      const width = columnWidth * span + SPACE.columnGapPt * (span - 1)
      const x = this.left + used * (columnWidth + SPACE.columnGapPt)
      const font = field.strong ? FONT.medium : FONT.regular
      const valuePt = this.textHeight(field.value || ' ', font, SIZE.value, width)
      const heightPt = SIZE.label + 2 + SPACE.labelGapPt + valuePt + SPACE.rowGapPt
      current.cells.push({ field, x, width })
      current.heightPt = Math.max(current.heightPt, heightPt)
      used += span
    }
    if (current.cells.length > 0) rows.push(current)
    return rows
  }

  /** A wrapped paragraph across the content width (or a given box). */
  paragraph(
    text: string,
    options: { font?: string; size?: number; colour?: string; x?: number; width?: number } = {},
  ): void {
    const font = options.font ?? FONT.regular
    const size = options.size ?? SIZE.value
    const x = options.x ?? this.left
    const width = options.width ?? this.right - x
    const heightPt = this.textHeight(text, font, size, width)
    this.ensureSpace(heightPt)
    this.doc
      .font(font)
      .fontSize(size)
      .fillColor(options.colour ?? COLOUR.ink)
      .text(text, x, this.y, { width })
    this.y += heightPt
  }

  gap(pt: number): void {
    this.y += pt
  }
}
