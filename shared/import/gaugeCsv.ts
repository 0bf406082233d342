/**
 * Reads a DFT gauge's CSV export into gauge readings for the preview on the tablet. Nothing is
 * sent from here: the user checks the preview, and the confirmed rows go through
 * POST /api/parts/:id/readings like typed ones. Two layouts are understood:
 *   - one column of numbers (with or without a header such as "Reading (mils)"), grouped into
 *     spots of `readingsPerSpot` and areas of `spotsPerArea` for SSPC-PA 2, or one flat list
 *     (area 1, spot 0) for ISO 19840;
 *   - columns area, spot, reading (any order, header names case-insensitive), optionally a unit
 *     column.
 * The unit comes from a unit column, else the reading header ("mil", "µm"), else `defaultUnit`.
 * 1 mil = 25.4 µm exactly (TRADE.md).
 */
import Papa from 'papaparse'
import { milsToMicrons } from '../rules/units'

export type CsvUnit = 'um' | 'mil'

export interface GaugeCsvRow {
  areaNo: number
  spotNo: number
  thicknessUm: number
  /** Row of the file (1-based, header included), for the preview. */
  row: number
}

export interface GaugeCsvResult {
  layout: 'single-column' | 'area-spot-reading'
  rows: GaugeCsvRow[]
  /** One line per refused row, e.g. "row 7: 'abc' is not a number". */
  errors: string[]
  /** The unit the readings were read in (before conversion to µm). */
  unit: CsvUnit
}

export interface GaugeCsvOptions {
  rule?: 'SSPC-PA2' | 'ISO-19840'
  defaultUnit?: CsvUnit
  readingsPerSpot?: number
  spotsPerArea?: number
}

const MAX_UM = 10000

function unitIn(text: string): CsvUnit | null {
  const t = text.toLowerCase()
  if (/\bmils?\b|\bthou\b/.test(t)) return 'mil'
  if (/µm|μm|\bum\b|micron|micrometre|micrometer/.test(t)) return 'um'
  return null
}

function headerKind(cell: string): 'area' | 'spot' | 'reading' | 'unit' | null {
  const c = cell.trim().toLowerCase()
  if (/^units?$/.test(c)) return 'unit'
  if (/^area/.test(c)) return 'area'
  if (/^spot/.test(c)) return 'spot'
  if (/^(reading|thickness|dft|value|measurement)/.test(c)) return 'reading'
  return null
}

function toNumber(raw: string, decimalComma: boolean): number | null {
  let s = raw.trim()
  if (decimalComma) s = s.replace(',', '.')
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s)) return null
  return Number(s)
}

export function parseGaugeCsv(text: string, options: GaugeCsvOptions = {}): GaugeCsvResult {
  const rule = options.rule ?? 'SSPC-PA2'
  const perSpot = options.readingsPerSpot ?? 3
  const perArea = options.spotsPerArea ?? 5
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' })
  const decimalComma = parsed.meta.delimiter !== ','
  const table = parsed.data.map((cells) => cells.map((c) => String(c ?? '')))
  const errors: string[] = []
  const rows: GaugeCsvRow[] = []

  const first = table[0] ?? []
  const kinds = first.map(headerKind)
  const hasHeader = first.some((c) => c.trim() !== '' && toNumber(c, decimalComma) === null)
  const col = (k: 'area' | 'spot' | 'reading' | 'unit') => kinds.indexOf(k)
  const structured = hasHeader && col('area') >= 0 && col('spot') >= 0 && col('reading') >= 0
  const readingCol = structured
    ? col('reading')
    : hasHeader && col('reading') >= 0
      ? col('reading')
      : 0
  const headerUnit = hasHeader ? unitIn(first[readingCol] ?? '') : null
  const fileUnit: CsvUnit = headerUnit ?? options.defaultUnit ?? 'um'
  const unitCol = structured ? col('unit') : -1
  const body = hasHeader ? table.slice(1) : table
  const offset = hasHeader ? 2 : 1

  const reading = (raw: string | undefined, rowNo: number, unit: CsvUnit): number | null => {
    const value = toNumber(raw ?? '', decimalComma)
    if (value === null) {
      errors.push(`row ${rowNo}: '${(raw ?? '').trim()}' is not a number`)
      return null
    }
    const um = unit === 'mil' ? milsToMicrons(value) : value
    if (um < 0 || um > MAX_UM) {
      errors.push(
        `row ${rowNo}: ${value} ${unit === 'mil' ? 'mil' : 'µm'} is outside 0–${MAX_UM} µm`,
      )
      return null
    }
    return um
  }

  let count = 0
  body.forEach((cells, i) => {
    const rowNo = i + offset
    if (!structured) {
      const um = reading(cells[readingCol], rowNo, fileUnit)
      if (um === null) return
      const spotIndex = Math.floor(count / perSpot)
      rows.push(
        rule === 'ISO-19840'
          ? { areaNo: 1, spotNo: 0, thicknessUm: um, row: rowNo }
          : {
              areaNo: Math.floor(spotIndex / perArea) + 1,
              spotNo: (spotIndex % perArea) + 1,
              thicknessUm: um,
              row: rowNo,
            },
      )
      count += 1
      return
    }
    const unit = (unitCol >= 0 ? unitIn(cells[unitCol] ?? '') : null) ?? fileUnit
    const area = toNumber(cells[col('area')] ?? '', false)
    const spot = toNumber(cells[col('spot')] ?? '', false)
    if (area === null || !Number.isInteger(area) || area < 1) {
      errors.push(
        `row ${rowNo}: area '${(cells[col('area')] ?? '').trim()}' is not a whole number from 1`,
      )
      return
    }
    if (spot === null || !Number.isInteger(spot) || spot < 0) {
      errors.push(`row ${rowNo}: spot '${(cells[col('spot')] ?? '').trim()}' is not a whole number`)
      return
    }
    const um = reading(cells[readingCol], rowNo, unit)
    if (um !== null) rows.push({ areaNo: area, spotNo: spot, thicknessUm: um, row: rowNo })
  })
  return {
    layout: structured ? 'area-spot-reading' : 'single-column',
    rows,
    errors,
    unit: fileUnit,
  }
}
