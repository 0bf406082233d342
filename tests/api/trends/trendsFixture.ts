import { randomUUID } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { sequelize } from '../../../server/db'
import { Customer } from '../../../server/db/models'
import { createUser } from '../support/fixtures'
import { fbeContent } from '../setup/setupFixtures'

/**
 * A small history written straight into the tables (SQL inserts), so every expected number in the
 * trend tests can be worked out by hand. Times are UTC (the server's session time zone).
 */
const q = <T extends object>(sql: string, bind: unknown[]) =>
  sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT })

export async function spec(code: string, minUm: number, maxUm: number | null) {
  const content = fbeContent({
    thickness: { rule: 'SSPC-PA2', bandUnit: 'um', minUm, maxUm, pa2Level: 3 },
  })
  const [row] = await q<{ id: number }>(
    `INSERT INTO coating_specs (code, title) VALUES ($1, $2) RETURNING id`,
    [code, `${code} test spec`],
  )
  await q(`INSERT INTO spec_versions (spec_id, version, content) VALUES ($1, 1, $2) RETURNING id`, [
    row!.id,
    JSON.stringify(content),
  ])
  return row!.id
}

export interface PartSpec {
  meanUm: number | null
  status: 'pass' | 'fail' | 'incomplete'
  failing?: string[]
  areaM2?: number | null
  quantity?: number
  sampled?: boolean
}

let lotNo = 0

/** One lot with its parts, the k-th part booked `k` minutes after `at`. Returns the part ids. */
export async function lot(opts: {
  at: string
  specId: number
  customerId: number
  userId: number
  line?: 'fbe-powder' | 'liquid-epoxy'
  shift?: '1' | '2' | '3'
  parts: PartSpec[]
  partNumber?: string
}): Promise<{ lotId: number; partIds: number[] }> {
  lotNo += 1
  const [l] = await q<{ id: number }>(
    `INSERT INTO lots (lot_number, customer_id, order_ref, spec_id, spec_version, line, shift,
       coating_material, batch_number, batch_expires_on, status, opened_by, client_id, created_at)
     VALUES ($1, $2, 'PO-TEST', $3, 1, $4, $5, 'FBE test powder', 'B-1', '2099-01-01', 'released', $6, $7, $8)
     RETURNING id`,
    [
      `T${lotNo}`,
      opts.customerId,
      opts.specId,
      opts.line ?? 'fbe-powder',
      opts.shift ?? '1',
      opts.userId,
      randomUUID(),
      opts.at,
    ],
  )
  const partIds: number[] = []
  for (const [i, p] of opts.parts.entries()) {
    const verdict = {
      status: p.status,
      criteria: ['surface-prep', 'climate', 'thickness', 'holiday', 'cure', 'adhesion'].map(
        (c) => ({
          criterion: c,
          status: p.failing?.includes(c) ? 'fail' : 'pass',
        }),
      ),
    }
    const [row] = await q<{ id: number }>(
      `INSERT INTO parts (lot_id, part_number, quantity, coated_area_m2, sampled, verdict, verdict_status,
         first_pass_status, thickness_mean_um, client_id, created_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $7, $8, $9, $10::timestamptz + make_interval(mins => $11))
       RETURNING id`,
      [
        l!.id,
        opts.partNumber ?? 'VB-150-FL',
        p.quantity ?? 1,
        p.areaM2 ?? null,
        p.sampled ?? true,
        JSON.stringify(verdict),
        p.status,
        p.meanUm,
        randomUUID(),
        opts.at,
        i + 1,
      ],
    )
    partIds.push(row!.id)
  }
  return { lotId: l!.id, partIds }
}

/** A round-1 holiday record with `found` holidays, `open` of them not repaired. */
export async function holidayRecord(partId: number, userId: number, found: number, open = 0) {
  const holidays = Array.from({ length: found }, (_, i) => ({
    found: true,
    repaired: i >= open,
    retested: i >= open,
    location: `spot ${i + 1}`,
  }))
  // A test that found nothing is still a test: one "not found" entry must not count.
  if (found === 0)
    holidays.push({ found: false, repaired: false, retested: false, location: 'all' })
  await q(
    `INSERT INTO section_records (part_id, round, section, data, recorded_by, client_id)
     VALUES ($1, 1, 'holiday', $2, $3, $4) RETURNING id`,
    [
      partId,
      JSON.stringify({ method: 'high-voltage', voltageUsedV: 2000, holidays }),
      userId,
      randomUUID(),
    ],
  )
}

export async function defectType(code: string, label: string) {
  const [row] = await q<{ id: number }>(
    `INSERT INTO defect_types (code, label) VALUES ($1, $2) RETURNING id`,
    [code, label],
  )
  return row!.id
}

let ncNo = 0
export async function nonconformance(
  lotId: number,
  partIds: number[],
  defectTypeId: number,
  userId: number,
) {
  ncNo += 1
  const [nc] = await q<{ id: number }>(
    `INSERT INTO nonconformances (number, lot_id, source, defect_type_id, description, opened_by)
     VALUES ($1, $2, 'manual', $3, 'test nonconformance', $4) RETURNING id`,
    [`NC-T-${ncNo}`, lotId, defectTypeId, userId],
  )
  for (const partId of partIds) {
    await q(
      `INSERT INTO nonconformance_parts (nonconformance_id, part_id, round_found) VALUES ($1, $2, 1) RETURNING part_id`,
      [nc!.id, partId],
    )
  }
}

export async function people() {
  const operator = await createUser('operator')
  const c1 = await Customer.create({ name: 'Trend Water Board', code: 'TRW' })
  const c2 = await Customer.create({ name: 'Trend Pipeline Contractors', code: 'TRP' })
  return { userId: operator.id, c1: c1.id, c2: c2.id }
}
