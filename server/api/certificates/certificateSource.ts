/** Everything a certificate is built from, read from the released lot inside the issuing transaction. */
import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { ReadingRowInput, SectionRowInput } from '../../../shared/inspection/assemblePartInput'
import type { Disposition, NcStatus } from '../../../shared/api/review'
import type { Line } from '../../../shared/api/lots'
import type { SectionName } from '../../../shared/api/lots'

export interface SourceLot {
  id: number
  lot_number: string
  status: string
  order_ref: string
  line: Line
  shift: string
  coating_material: string
  batch_number: string
  batch_expires_on: string
  spec_id: number
  spec_version: number
  spec_code: string
  spec_title: string
  customer_id: number
  customer_name: string
  customer_address: string
  thickness_unit: 'um' | 'mil'
}

export interface SourcePart {
  id: number
  part_number: string
  description: string
  heat_number: string
  quantity: number
  round: number
  sampled: boolean
  verdict: PartVerdict | null
  scrapped_by_nc: number | null
  sections: SectionRowInput[] | null
  carried_sections: SectionName[] | null
  readings: ReadingRowInput[] | null
}

export interface SourceNc {
  id: number
  number: string
  status: NcStatus
  disposition: Disposition | null
  concession_ref: string | null
  description: string
  defect_label: string
  part_ids: number[]
}

export interface CertificateSource {
  lot: SourceLot
  parts: SourcePart[]
  nonconformances: SourceNc[]
  inspectors: { name: string; date: string }[]
  release: { name: string; date: string; independence_waived: boolean } | null
}

const q = <T extends object>(sql: string, lotId: number, t: Transaction) =>
  sequelize.query<T>(sql, { bind: [lotId], type: QueryTypes.SELECT, transaction: t })

export async function loadCertificateSource(
  lotId: number,
  t: Transaction,
): Promise<CertificateSource | null> {
  const [lot] = await q<SourceLot>(
    `SELECT l.id, l.lot_number, l.status, l.order_ref, l.line, l.shift, l.coating_material,
            l.batch_number, to_char(l.batch_expires_on, 'YYYY-MM-DD') AS batch_expires_on,
            l.spec_id, l.spec_version, s.code AS spec_code, s.title AS spec_title,
            c.id AS customer_id, c.name AS customer_name, c.address AS customer_address, c.thickness_unit
       FROM lots l JOIN customers c ON c.id = l.customer_id JOIN coating_specs s ON s.id = l.spec_id
      WHERE l.id = $1`,
    lotId,
    t,
  )
  if (!lot) return null
  // Current round: the latest record of each section (carried ones of a repair round included),
  // the readings not discarded.
  const parts = await q<SourcePart>(
    `SELECT p.id, p.part_number, p.description, p.heat_number, p.quantity, p.round, p.sampled,
            p.verdict, p.scrapped_by_nc,
            (SELECT json_agg(json_build_object('section', s.section, 'round', s.round, 'data', s.data) ORDER BY s.id)
               FROM (SELECT DISTINCT ON (section) id, section, round, data FROM section_records
                      WHERE part_id = p.id AND (round = p.round
                        OR (round < p.round AND section = ANY(p.carried_sections)))
                      ORDER BY section, round DESC, id DESC) s) AS sections,
            p.carried_sections,
            (SELECT json_agg(json_build_object('round', r.round, 'areaNo', r.area_no, 'spotNo', r.spot_no,
                      'thicknessUm', r.thickness_um, 'discarded', false, 'suspect', r.suspect,
                      'instrumentKind', i.kind) ORDER BY r.area_no, r.spot_no, r.id)
               FROM gauge_readings r JOIN instruments i ON i.id = r.instrument_id
              WHERE r.part_id = p.id AND r.round = p.round AND r.discarded_at IS NULL) AS readings
       FROM parts p WHERE p.lot_id = $1 ORDER BY p.id`,
    lotId,
    t,
  )
  const nonconformances = await q<SourceNc>(
    `SELECT n.id, n.number, n.status, n.disposition, n.concession_ref, n.description,
            d.label AS defect_label,
            coalesce(array_agg(np.part_id ORDER BY np.part_id) FILTER (WHERE np.part_id IS NOT NULL), '{}') AS part_ids
       FROM nonconformances n JOIN defect_types d ON d.id = n.defect_type_id
       LEFT JOIN nonconformance_parts np ON np.nonconformance_id = n.id
      WHERE n.lot_id = $1 GROUP BY n.id, d.label ORDER BY n.id`,
    lotId,
    t,
  )
  // Who recorded the lot's inspection (any round), with the last day they did.
  const inspectors = await q<{ name: string; date: string }>(
    `SELECT u.name, to_char(max(x.at), 'YYYY-MM-DD') AS date
       FROM (SELECT recorded_by AS who, recorded_at AS at FROM gauge_readings WHERE lot_id = $1
             UNION ALL
             SELECT s.recorded_by, s.recorded_at FROM section_records s JOIN parts p ON p.id = s.part_id
              WHERE p.lot_id = $1) x
       JOIN users u ON u.id = x.who
      GROUP BY u.id, u.name ORDER BY max(x.at), u.name`,
    lotId,
    t,
  )
  const [release] = await q<{ name: string; date: string; independence_waived: boolean }>(
    `SELECT u.name, to_char(d.decided_at, 'YYYY-MM-DD') AS date, d.independence_waived
       FROM lot_decisions d JOIN users u ON u.id = d.decided_by
      WHERE d.lot_id = $1 AND d.decision = 'release' ORDER BY d.id DESC LIMIT 1`,
    lotId,
    t,
  )
  return { lot, parts, nonconformances, inspectors, release: release ?? null }
}
