/**
 * Reading certificates. A customer user sees their own company's certificates only: every query
 * carries the company filter, and a certificate of another company answers exactly the 404 a
 * missing one does, so an id tells a guesser nothing.
 */
import { QueryTypes } from 'sequelize'
import type { z } from 'zod'
import { sequelize } from '../../db'
import { notFound } from '../../lib/httpError'
import type { User } from '../../db/models'
import type {
  CertificateDetail,
  CertificateRow,
  CertificateState,
  DeliveryKind,
  DeliveryRow,
  DeliveryState,
  certificateListQuerySchema,
} from '../../../shared/api/certificates'

type ListQuery = z.infer<typeof certificateListQuerySchema>

const ROW_SELECT = `
  SELECT c.id, c.number, c.kind, c.state, c.issued_at, c.lot_id, l.lot_number, c.customer_id,
         cu.name AS customer_name, l.order_ref, c.pdf_sha256, c.needs_reissue,
         (SELECT coalesce(array_agg(p ->> 'partNumber'), '{}') FROM jsonb_array_elements(c.data -> 'parts') p) AS part_numbers,
         (SELECT coalesce(array_agg(DISTINCT p ->> 'heatNumber') FILTER (WHERE p ->> 'heatNumber' <> ''), '{}')
            FROM jsonb_array_elements(c.data -> 'parts') p) AS heat_numbers
    FROM certificates c
    JOIN lots l ON l.id = c.lot_id
    JOIN customers cu ON cu.id = c.customer_id`

interface SqlRow {
  id: number
  number: string
  kind: CertificateRow['kind']
  state: CertificateState
  issued_at: Date
  lot_id: number
  lot_number: string
  customer_id: number
  customer_name: string
  order_ref: string
  pdf_sha256: string
  needs_reissue: boolean
  part_numbers: string[]
  heat_numbers: string[]
}

function toRow(r: SqlRow): CertificateRow {
  return {
    id: r.id,
    number: r.number,
    kind: r.kind,
    state: r.state,
    issuedAt: new Date(r.issued_at).toISOString(),
    lotId: r.lot_id,
    lotNumber: r.lot_number,
    customerId: r.customer_id,
    customerName: r.customer_name,
    orderRef: r.order_ref,
    partNumbers: r.part_numbers,
    heatNumbers: r.heat_numbers,
    fingerprint: r.pdf_sha256,
    needsReissue: r.needs_reissue,
  }
}

/** The company a reader is limited to: a customer's own, or null (staff see every company). */
function companyOf(user: User): number | null {
  return user.role === 'customer' ? (user.customerId ?? -1) : null
}

export async function listCertificates(
  user: User,
  query: ListQuery & { needsReissue?: boolean },
): Promise<{ rows: CertificateRow[]; total: number }> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  const company = companyOf(user)
  if (company !== null) add((n) => `c.customer_id = ${n}`, company)
  else if (query.customerId) add((n) => `c.customer_id = ${n}`, query.customerId)
  if (query.state) add((n) => `c.state = ${n}`, query.state)
  if (query.needsReissue) where.push(`c.needs_reissue AND c.state = 'valid'`)
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`
    add(
      (n) => `(c.number ILIKE ${n} OR l.lot_number ILIKE ${n} OR l.order_ref ILIKE ${n}
        OR EXISTS (SELECT 1 FROM parts p WHERE p.lot_id = c.lot_id
                    AND (p.part_number ILIKE ${n} OR p.heat_number ILIKE ${n})))`,
      like,
    )
  }
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : ''
  const [count] = await sequelize.query<{ total: number }>(
    `SELECT count(*)::int AS total FROM certificates c JOIN lots l ON l.id = c.lot_id ${whereSql}`,
    { bind, type: QueryTypes.SELECT },
  )
  const rows = await sequelize.query<SqlRow>(
    `${ROW_SELECT} ${whereSql} ORDER BY c.issued_at DESC, c.id DESC
      LIMIT ${query.limit} OFFSET ${query.offset}`,
    { bind, type: QueryTypes.SELECT },
  )
  return { rows: rows.map(toRow), total: count?.total ?? 0 }
}

interface DetailSql extends SqlRow {
  content_sha256: string
  verify_code: string
  verify_url: string
  issued_by_name: string
  supersedes_id: number | null
  supersedes_number: string | null
  reissue_reason: string | null
  superseded_by_id: number | null
  superseded_by_number: string | null
  superseded_at: Date | null
  revoked_at: Date | null
  revoke_reason: string | null
  revoked_by_name: string | null
}

function deliveryState(status: string): DeliveryState {
  return status === 'sent' ? 'sent' : status === 'failed' ? 'failed' : 'queued'
}

async function deliveriesOf(certificateId: number): Promise<DeliveryRow[]> {
  const rows = await sequelize.query<Record<string, unknown>>(
    `SELECT id, kind, recipient_name, recipient_email, status, attempts, last_error, created_at,
            last_attempt_at, next_attempt_at, sent_at
       FROM mail_outbox WHERE certificate_id = $1 ORDER BY id`,
    { bind: [certificateId], type: QueryTypes.SELECT },
  )
  const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)
  return rows.map((r) => ({
    id: Number(r.id),
    kind: r.kind as DeliveryKind,
    recipientName: String(r.recipient_name),
    recipientEmail: String(r.recipient_email),
    state: deliveryState(String(r.status)),
    attempts: Number(r.attempts),
    lastError: (r.last_error as string | null) ?? null,
    queuedAt: iso(r.created_at)!,
    lastAttemptAt: iso(r.last_attempt_at),
    nextAttemptAt: r.status === 'queued' ? iso(r.next_attempt_at) : null,
    sentAt: iso(r.sent_at),
  }))
}

export async function getCertificateDetail(user: User, id: number): Promise<CertificateDetail> {
  const company = companyOf(user)
  const [r] = await sequelize.query<DetailSql>(
    `SELECT x.*, c.content_sha256, c.verify_code, c.data ->> 'verifyUrl' AS verify_url,
            iu.name AS issued_by_name, c.supersedes_id, sp.number AS supersedes_number,
            c.reissue_reason, c.superseded_by_id, sb.number AS superseded_by_number,
            c.superseded_at, c.revoked_at, c.revoke_reason, ru.name AS revoked_by_name
       FROM (${ROW_SELECT} WHERE c.id = $1 AND ($2::int IS NULL OR c.customer_id = $2)) x
       JOIN certificates c ON c.id = x.id
       JOIN users iu ON iu.id = c.issued_by
       LEFT JOIN certificates sp ON sp.id = c.supersedes_id
       LEFT JOIN certificates sb ON sb.id = c.superseded_by_id
       LEFT JOIN users ru ON ru.id = c.revoked_by`,
    { bind: [id, company], type: QueryTypes.SELECT },
  )
  if (!r) throw notFound(`Certificate #${id}`)
  return {
    ...toRow(r),
    contentFingerprint: r.content_sha256,
    verifyCode: r.verify_code,
    verifyUrl: r.verify_url,
    issuedBy: r.issued_by_name,
    supersedes:
      r.supersedes_id === null
        ? null
        : {
            id: r.supersedes_id,
            number: r.supersedes_number ?? '',
            reason: r.reissue_reason ?? '',
          },
    supersededBy:
      r.superseded_by_id === null
        ? null
        : {
            id: r.superseded_by_id,
            number: r.superseded_by_number ?? '',
            at: new Date(r.superseded_at!).toISOString(),
          },
    revoked: r.revoked_at
      ? {
          at: new Date(r.revoked_at).toISOString(),
          reason: r.revoke_reason ?? '',
          byName: r.revoked_by_name ?? '',
        }
      : null,
    deliveries: company === null ? await deliveriesOf(r.id) : null,
  }
}

/** The stored bytes, exactly as issued. */
export async function getCertificatePdf(
  user: User,
  id: number,
): Promise<{ number: string; pdf: Buffer; sha256: string }> {
  const [r] = await sequelize.query<{ number: string; pdf: Buffer; pdf_sha256: string }>(
    `SELECT number, pdf, pdf_sha256 FROM certificates
      WHERE id = $1 AND ($2::int IS NULL OR customer_id = $2)`,
    { bind: [id, companyOf(user)], type: QueryTypes.SELECT },
  )
  if (!r) throw notFound(`Certificate #${id}`)
  return { number: r.number, pdf: Buffer.from(r.pdf), sha256: r.pdf_sha256 }
}
