/** The inspection results (types 2.2 and 3.1) and the parts list every type carries. */
import type { CertificateData } from '../../../shared/api/certificates'
import { FONT } from '../fonts'
import { formatThickness, unitName, unitSymbol } from '../format'
import type { Sheet } from '../layout'
import { drawTable, tableLeadHeight, type Column, type TableRow } from '../table'
import { COLOUR, SIZE, SPACE } from '../theme'

/**
 * Shown wherever a holiday test voltage is printed (project rule). On a certificate the voltage
 * is a record of the test, so the wording says it is not an instruction.
 */
export const HOLIDAY_VOLTAGE_CAUTION =
  'Caution: high-voltage holiday testers can cause injury. The voltage is recorded here as a ' +
  'fact of the test, not as an instruction; the governing standard, the equipment maker’s ' +
  'instructions, local codes and licensed practice take precedence.'

const NOT_MEASURED = '—'

export function drawParts(sheet: Sheet, data: CertificateData): void {
  const withResults = data.kind !== '2.1'
  const unit = unitSymbol(data.thicknessUnit)
  const columns: Column[] = [
    { title: 'Part no.', weight: 12.5 },
    { title: 'Description', weight: withResults ? 23 : 44 },
    { title: 'Heat / serial no.', weight: withResults ? 13.5 : 18 },
    { title: 'Qty', weight: 5, align: 'right' },
  ]
  if (withResults) {
    columns.push(
      // n: how many accepted readings the statistics rest on.
      { title: 'n', weight: 5, align: 'right' },
      { title: `Min ${unit}`, weight: 7.5, align: 'right' },
      { title: `Mean ${unit}`, weight: 8.5, align: 'right' },
      { title: `Max ${unit}`, weight: 7.5, align: 'right' },
      { title: 'Result', weight: 12.5 },
    )
  }
  const rows: TableRow[] = data.parts.map((part) => {
    const cells = [part.partNumber, part.description, part.heatNumber, String(part.quantity)]
    if (withResults) {
      const t = part.thickness
      const u = data.thicknessUnit
      cells.push(
        t ? String(t.n) : NOT_MEASURED,
        t ? formatThickness(t.minUm, u) : NOT_MEASURED,
        t ? formatThickness(t.meanUm, u) : NOT_MEASURED,
        t ? formatThickness(t.maxUm, u) : NOT_MEASURED,
        part.verdict,
      )
    }
    return { cells, strongFirst: true }
  })
  // Type 2.1 lists the parts only; the statement says what they comply with.
  const caption = withResults
    ? `Dry film thickness of each part’s accepted readings, in ${unitName(data.thicknessUnit)}. ` +
      `Band ${data.spec.band}; ${data.spec.acceptanceRule}.`
    : null
  const captionPt = caption
    ? sheet.textHeight(caption, FONT.regular, SIZE.small, sheet.width) + 6
    : 0
  const title = withResults ? 'Parts and dry film thickness' : 'Parts'
  sheet.heading(title, captionPt + tableLeadHeight(sheet, columns, rows))
  if (caption) {
    sheet.paragraph(caption, { size: SIZE.small, colour: COLOUR.muted })
    sheet.gap(6)
  }
  drawTable(sheet, columns, rows, `${title}, continued`)
  sheet.gap(SPACE.sectionGapPt)
}

export function drawHoliday(sheet: Sheet, data: CertificateData): void {
  const holiday = data.holiday
  if (!holiday) {
    const fields = [{ label: 'Holiday test', value: 'Not applicable' }]
    sheet.heading('Holiday test', sheet.gridHeight(fields, 1))
    sheet.grid(fields, 1)
  } else {
    const fields = [
      { label: 'Method', value: holiday.method, span: 2 },
      { label: 'Test voltage', value: holiday.voltage },
      { label: 'Result', value: holiday.result, strong: true },
    ]
    const cautionPt = sheet.textHeight(
      HOLIDAY_VOLTAGE_CAUTION,
      FONT.regular,
      SIZE.small,
      sheet.width,
    )
    sheet.heading('Holiday test', sheet.gridHeight(fields, 4) + cautionPt)
    sheet.grid(fields, 4)
    sheet.gap(-SPACE.rowGapPt / 2)
    sheet.paragraph(HOLIDAY_VOLTAGE_CAUTION, { size: SIZE.small, colour: COLOUR.muted })
  }
  sheet.gap(SPACE.sectionGapPt)
}

/** Two lists side by side; each line is one recorded test, worded by the server. */
export function drawCureAndAdhesion(sheet: Sheet, data: CertificateData): void {
  const half = (sheet.width - SPACE.columnGapPt) / 2
  const lists: [string, string[], number][] = [
    ['Cure', data.cure, sheet.left],
    ['Adhesion', data.adhesion, sheet.left + half + SPACE.columnGapPt],
  ]
  const texts = lists.map(([, lines]) =>
    lines.length ? lines.map((l) => `•  ${l}`).join('\n') : 'Not applicable',
  )
  const bodyPt = Math.max(...texts.map((t) => sheet.textHeight(t, FONT.regular, SIZE.value, half)))
  const heightPt = SIZE.label + 2 + SPACE.labelGapPt + bodyPt
  sheet.heading('Cure and adhesion', heightPt)
  lists.forEach(([label, , x], i) => {
    sheet.label(label, x, sheet.y, half)
    sheet.doc
      .font(FONT.regular)
      .fontSize(SIZE.value)
      .fillColor(COLOUR.ink)
      .text(texts[i] ?? '', x, sheet.y + SIZE.label + 2 + SPACE.labelGapPt, { width: half })
  })
  sheet.y += heightPt + SPACE.sectionGapPt
}
