import { z } from 'zod'
import type { LotRow, Stamp } from './lots'

/**
 * QA review: the queue, decisions, nonconformances, reopening, and the audit trail. Routes:
 *   POST /api/lots/:id/submit                 operator/supervisor: inspection finished → 'awaiting-review';
 *                                             refused while a sampled part is incomplete; opens a
 *                                             nonconformance for each failing criterion of each part
 *   GET  /api/review/queue                    QA: lots awaiting review (oldest first) and on hold
 *   POST /api/lots/:id/decisions              QA: { decision, reason, version } release | hold | reject
 *   GET  /api/lots/:id/decisions              staff: every decision, never deleted
 *   POST /api/lots/:id/reopen                 QA: { reason, version } released/on-hold → open; certificates
 *                                             of the lot are marked as needing reissue
 *   GET  /api/nonconformances?status&lotId    staff
 *   POST /api/nonconformances                 FLOOR+QA: opened by hand { lotId, partIds, defectTypeId, description }
 *   GET  /api/nonconformances/:id             staff
 *   POST /api/nonconformances/:id/disposition QA: { disposition, concessionRef?, note, version }
 *   POST /api/nonconformances/:id/close       QA: { verification, version }
 *   POST /api/nonconformances/:id/photos      FLOOR+QA multipart, like part photos
 *   GET  /api/defect-types (staff), POST /api/defect-types, PATCH /api/defect-types/:id (admin)
 *   GET  /api/lots/:id/history                staff: the lot's audit events, oldest first
 *   GET  /api/audit?actorId&entityType&entityId&lotNumber&from&to&limit&offset   admin
 */

export const DECISIONS = ['release', 'hold', 'reject'] as const
export type Decision = (typeof DECISIONS)[number]

export const decisionSchema = z
  .object({
    decision: z.enum(DECISIONS),
    reason: z.string().trim().max(1000).default(''),
    /** The lot version the supervisor looked at: a stale one answers 409 with the current state. */
    version: z.number().int().min(1),
  })
  .refine((d) => d.decision === 'release' || d.reason.length >= 3, {
    message: 'Hold and reject need a reason',
    path: ['reason'],
  })

export const reopenSchema = z.object({
  reason: z.string().trim().min(3, 'Give a reason').max(1000),
  version: z.number().int().min(1),
})

export const DISPOSITIONS = ['repair-retest', 'strip-recoat', 'use-as-is', 'scrap'] as const
export type Disposition = (typeof DISPOSITIONS)[number]
export const DISPOSITION_LABELS: Record<Disposition, string> = {
  'repair-retest': 'Repair and retest',
  'strip-recoat': 'Strip and recoat',
  'use-as-is': 'Use as is (customer concession)',
  scrap: 'Scrap',
}

export const NC_STATUSES = ['open', 'dispositioned', 'closed'] as const
export type NcStatus = (typeof NC_STATUSES)[number]

export const createNcSchema = z.object({
  lotId: z.number().int().positive(),
  partIds: z.array(z.number().int().positive()).min(1).max(500),
  defectTypeId: z.number().int().positive(),
  description: z.string().trim().min(3).max(2000),
})
export const dispositionSchema = z
  .object({
    disposition: z.enum(DISPOSITIONS),
    concessionRef: z.string().trim().max(100).nullable().default(null),
    note: z.string().trim().max(2000).default(''),
    version: z.number().int().min(1),
  })
  .refine((d) => d.disposition !== 'use-as-is' || (d.concessionRef ?? '').length > 0, {
    message: "Use as is needs the customer's concession reference",
    path: ['concessionRef'],
  })
export const closeNcSchema = z.object({
  /** How it was verified that the disposition was carried out. */
  verification: z.string().trim().min(3, 'Say how the disposition was verified').max(2000),
  version: z.number().int().min(1),
})
export const defectTypeSchema = z.object({
  code: z.string().trim().toLowerCase().regex(/^[a-z0-9-]{2,40}$/),
  label: z.string().trim().min(2).max(100),
  active: z.boolean().default(true),
})

export interface DecisionRow {
  id: number
  lotId: number
  decision: Decision
  reason: string
  decided: Stamp
  /** Set when the plant setting let the recorder release their own lot. */
  independenceWaived: boolean
}

export interface NonconformanceRow {
  id: number
  number: string
  lotId: number
  lotNumber: string
  status: NcStatus
  source: 'auto' | 'manual'
  /** The failing criterion that opened it, when opened automatically. */
  criterion: string | null
  defectTypeId: number
  defectLabel: string
  description: string
  parts: { id: number; partNumber: string; heatNumber: string; round: number }[]
  disposition: Disposition | null
  concessionRef: string | null
  dispositionNote: string
  dispositioned: Stamp | null
  verification: string | null
  closed: Stamp | null
  opened: Stamp
  version: number
}

export interface QueueRow extends LotRow {
  submittedAt: string | null
  openNonconformances: number
  /** Recorded readings or sections of this lot — they may not release it unless the plant allows. */
  recorderIds: number[]
}

export interface AuditEventRow {
  id: string
  at: string
  actorId: number | null
  actorEmail: string | null
  action: string
  entityType: string
  entityId: string
  lotId: number | null
  before: unknown
  after: unknown
  note: string
}
