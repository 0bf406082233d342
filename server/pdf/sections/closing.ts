/** Nonconformances, the statement of conformance and who inspected and approved. */
import type { CertificateData } from '../../../shared/api/certificates'
import { FONT } from '../fonts'
import { formatDate } from '../format'
import { HEADING_PT, type Sheet } from '../layout'
import { drawTable, tableLeadHeight, type Column, type TableRow } from '../table'
import { COLOUR, SIZE, SPACE } from '../theme'

export function drawNonconformances(sheet: Sheet, data: CertificateData): void {
  if (data.nonconformances.length === 0) {
    const text = 'No nonconformance was raised on this lot.'
    sheet.heading('Nonconformances', sheet.textHeight(text, FONT.regular, SIZE.value, sheet.width))
    sheet.paragraph(text)
    sheet.gap(SPACE.sectionGapPt)
    return
  }
  const columns: Column[] = [
    { title: 'NC no.', weight: 13 },
    { title: 'Defect', weight: 33 },
    { title: 'Disposition', weight: 22 },
    { title: 'Concession ref.', weight: 18 },
    { title: 'State', weight: 10 },
  ]
  const rows: TableRow[] = data.nonconformances.map((nc) => ({
    cells: [
      nc.number,
      nc.defect,
      nc.disposition,
      nc.concessionRef ?? '—',
      nc.closed ? 'Closed' : 'Open',
    ],
    strongFirst: true,
  }))
  sheet.heading('Nonconformances', tableLeadHeight(sheet, columns, rows))
  drawTable(sheet, columns, rows, 'Nonconformances, continued')
  sheet.gap(SPACE.sectionGapPt)
}

const TYPE_21_NOTE =
  'EN 10204 type 2.1: this document declares that the products comply with the order; it ' +
  'carries no test results.'

const STATEMENT_PT = 10
const STATEMENT_INSET_PT = 12

function statementBlockHeight(sheet: Sheet, data: CertificateData): number {
  const width = sheet.width - STATEMENT_INSET_PT
  const note = data.kind === '2.1' ? TYPE_21_NOTE : null
  const statementPt = sheet.textHeight(data.statement, FONT.regular, STATEMENT_PT, width)
  const notePt = note ? sheet.textHeight(note, FONT.regular, SIZE.small, width) + 6 : 0
  return statementPt + notePt + 4
}

/**
 * Inspected by / approved by with dates. For 3.1 the approver is the manufacturer's authorised
 * inspection representative independent of production (EN 10204, TRADE.md §7 [R]).
 */
function signOffFields(data: CertificateData) {
  const approverLabel =
    data.kind === '3.1' ? 'Approved by (authorised inspection representative)' : 'Approved by'
  const inspectors = data.inspectedBy.length
    ? data.inspectedBy.map((p) => `${p.name}, ${formatDate(p.date)}`).join('\n')
    : '—'
  return [
    { label: 'Inspected by', value: inspectors },
    { label: approverLabel, value: `${data.approvedBy.name}, ${formatDate(data.approvedBy.date)}` },
  ]
}

function signOffHeight(sheet: Sheet, data: CertificateData): number {
  const notePt = data.independenceNote
    ? sheet.textHeight(data.independenceNote, FONT.regular, SIZE.small, sheet.width)
    : 0
  return sheet.gridHeight(signOffFields(data), 2) + notePt
}

/**
 * The statement in plain words, set off by the accent rule so it reads as the point of the page,
 * then who inspected and approved. Kept on one page together: a statement whose signatures sit
 * overleaf reads as unsigned.
 */
export function drawStatementAndSignOff(sheet: Sheet, data: CertificateData): void {
  const blockPt = statementBlockHeight(sheet, data)
  const signOffPt = signOffHeight(sheet, data)
  sheet.ensureSpace(HEADING_PT + blockPt + SPACE.sectionGapPt + HEADING_PT + signOffPt)

  sheet.heading('Statement of conformance', blockPt)
  const top = sheet.y
  const textX = sheet.left + STATEMENT_INSET_PT
  const textWidth = sheet.width - STATEMENT_INSET_PT
  sheet.doc.rect(sheet.left, top, 2.5, blockPt).fill(COLOUR.accent)
  sheet.paragraph(data.statement, { size: STATEMENT_PT, x: textX, width: textWidth })
  if (data.kind === '2.1') {
    sheet.gap(6)
    sheet.paragraph(TYPE_21_NOTE, {
      size: SIZE.small,
      colour: COLOUR.muted,
      x: textX,
      width: textWidth,
    })
  }
  sheet.y = top + blockPt + SPACE.sectionGapPt

  sheet.heading('Inspection and approval', signOffPt)
  sheet.grid(signOffFields(data), 2)
  if (data.independenceNote) {
    sheet.gap(-SPACE.rowGapPt / 2)
    sheet.paragraph(data.independenceNote, { size: SIZE.small, colour: COLOUR.notice })
  }
}
