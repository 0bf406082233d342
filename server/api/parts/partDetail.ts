import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import { Lot, Part } from '../../db/models'
import { notFound } from '../../lib/httpError'
import type {
  PartDetail,
  ReadingRow,
  SectionName,
  SectionRecordRow,
} from '../../../shared/api/lots'
import { specContentFor } from '../lots/specCache'
import { toPartRow } from '../lots/lots.rows'

interface ReadingSqlRow {
  id: string
  client_id: string
  round: number
  area_no: number
  spot_no: number
  thickness_um: number
  instrument_id: number
  serial: string
  suspect: boolean
  discarded_at: Date | null
  discard_reason: string | null
  taken_at: Date
  recorded_by: number
  recorder_name: string
  recorded_at: Date
}

export const READING_SELECT = `
  SELECT r.id, r.client_id, r.round, r.area_no, r.spot_no, r.thickness_um, r.instrument_id, i.serial,
         r.suspect, r.discarded_at, r.discard_reason, r.taken_at, r.recorded_by, u.name AS recorder_name,
         r.recorded_at
    FROM gauge_readings r
    JOIN instruments i ON i.id = r.instrument_id
    JOIN users u ON u.id = r.recorded_by`

export function toReadingRow(r: ReadingSqlRow): ReadingRow {
  return {
    id: String(r.id),
    clientId: r.client_id,
    round: r.round,
    areaNo: r.area_no,
    spotNo: r.spot_no,
    thicknessUm: r.thickness_um,
    instrumentId: r.instrument_id,
    instrumentSerial: r.serial,
    suspect: r.suspect,
    discarded: r.discarded_at !== null,
    discardReason: r.discard_reason,
    takenAt: new Date(r.taken_at).toISOString(),
    recorded: {
      byId: r.recorded_by,
      byName: r.recorder_name,
      at: new Date(r.recorded_at).toISOString(),
    },
  }
}

export async function readingRows(
  where: string,
  bind: unknown[],
  t?: Transaction,
): Promise<ReadingRow[]> {
  const rows = await sequelize.query<ReadingSqlRow>(
    `${READING_SELECT} WHERE ${where} ORDER BY r.id`,
    {
      bind,
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  return rows.map(toReadingRow)
}

async function sectionRows(partId: number, t?: Transaction): Promise<SectionRecordRow[]> {
  const rows = await sequelize.query<{
    id: number
    client_id: string
    section: SectionName
    round: number
    instrument_id: number | null
    serial: string | null
    data: unknown
    recorded_by: number
    recorder_name: string
    recorded_at: Date
  }>(
    `SELECT s.id, s.client_id, s.section, s.round, s.instrument_id, i.serial, s.data, s.recorded_by,
            u.name AS recorder_name, s.recorded_at
       FROM section_records s
       LEFT JOIN instruments i ON i.id = s.instrument_id
       JOIN users u ON u.id = s.recorded_by
      WHERE s.part_id = $1 ORDER BY s.id`,
    { bind: [partId], type: QueryTypes.SELECT, transaction: t },
  )
  return rows.map((r) => ({
    id: r.id,
    clientId: r.client_id,
    section: r.section,
    round: r.round,
    instrumentId: r.instrument_id,
    instrumentSerial: r.serial,
    data: r.data,
    recorded: {
      byId: r.recorded_by,
      byName: r.recorder_name,
      at: new Date(r.recorded_at).toISOString(),
    },
  }))
}

/** GET /api/parts/:id: the part, its current and earlier records, every reading, verdict and plan. */
export async function getPartDetail(partId: number, t?: Transaction): Promise<PartDetail> {
  const part = await Part.findByPk(partId, { transaction: t })
  if (!part) throw notFound(`Part #${partId}`)
  const lot = await Lot.findByPk(part.lotId, {
    attributes: ['status', 'specId', 'specVersion'],
    transaction: t,
  })
  if (!lot) throw notFound(`Lot of part #${partId}`)
  const [spec, records, readings] = await Promise.all([
    specContentFor(lot.specId, lot.specVersion, t),
    sectionRows(partId, t),
    readingRows('r.part_id = $1', [partId], t),
  ])
  const sections: PartDetail['sections'] = {}
  const history: SectionRecordRow[] = []
  for (const r of records) {
    if (r.round !== part.round) {
      history.push(r)
      continue
    }
    const earlier = sections[r.section]
    if (earlier) history.push(earlier)
    sections[r.section] = r
  }
  // A repair round shows what it carries from the earlier round (its `round` says which).
  for (const r of history) {
    const now = sections[r.section]
    if (!part.carriedSections.includes(r.section) || (now && now.round === part.round)) continue
    if (!now || r.round >= now.round) sections[r.section] = r
  }
  for (const r of Object.values(sections)) {
    const i = r ? history.indexOf(r) : -1
    if (i >= 0) history.splice(i, 1)
  }
  history.sort((a, b) => a.id - b.id)
  return { ...toPartRow(part), lotStatus: lot.status, spec, sections, history, readings }
}
