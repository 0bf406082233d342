import { z } from 'zod'
import type { Role } from './roles'

/**
 * Certificates of conformance. Routes:
 *   POST /api/lots/:id/certificates            issue for a released lot (supervisor)       { kind }
 *   GET  /api/certificates?q&customerId         list (staff: all; customer: own company only)
 *   GET  /api/certificates/:id                  detail with deliveries (customer: own only, else 404)
 *   GET  /api/certificates/:id/pdf              the stored PDF bytes (customer: own only, else 404)
 *   POST /api/certificates/:id/reissue          new certificate superseding this one (supervisor) { reason, kind? }
 *   POST /api/certificates/:id/revoke           (supervisor) { reason }
 *   POST /api/certificates/:id/resend           queue the e-mail again (supervisor)
 *   GET  /api/verify/:code                      public, rate limited: validity only
 * The public page /verify/<code> (client route, no sign-in) is the QR code's target.
 */

/** EN 10204 inspection document types. 3.1 is the default. */
export const CERTIFICATE_KINDS = ['2.1', '2.2', '3.1'] as const
export type CertificateKind = (typeof CERTIFICATE_KINDS)[number]
export const CERTIFICATE_KIND_LABELS: Record<CertificateKind, string> = {
  '2.1': 'EN 10204 type 2.1 — declaration of compliance (no results)',
  '2.2': 'EN 10204 type 2.2 — test report (non-specific results)',
  '3.1': 'EN 10204 type 3.1 — inspection certificate (specific inspection results)',
}

export const issueCertificateSchema = z.object({ kind: z.enum(CERTIFICATE_KINDS).default('3.1') })
export const reasonSchema = z.object({ reason: z.string().trim().min(3, 'Give a reason').max(500) })
export const reissueSchema = reasonSchema.extend({ kind: z.enum(CERTIFICATE_KINDS).optional() })

export type CertificateState = 'valid' | 'superseded' | 'revoked'
export type DeliveryState = 'queued' | 'sent' | 'failed'
/** The certificate itself (PDF attached), or the notice sent when it is withdrawn. */
export type DeliveryKind = 'certificate' | 'withdrawal'

/** Everything the PDF shows; built by the server from the released lot, rendered by server/pdf. */
export interface CertificateData {
  number: string
  kind: CertificateKind
  issuedAt: string
  verifyUrl: string
  issuer: { name: string; address: string }
  customer: { name: string; address: string }
  orderRef: string
  lotNumber: string
  line: string
  shift: string
  coating: { material: string; batchNumber: string; batchExpiresOn: string }
  spec: { code: string; title: string; version: number; acceptanceRule: string; band: string }
  /** Unit the customer reads thickness in. */
  thicknessUnit: 'um' | 'mil'
  parts: {
    partNumber: string
    description: string
    heatNumber: string
    quantity: number
    /** Thickness statistics of the part's accepted readings, µm. */
    thickness: { n: number; minUm: number; meanUm: number; maxUm: number } | null
    verdict: string
  }[]
  surfacePrep: {
    gradeRequired: string
    gradesRecorded: string
    profileBand: string
    profileRecorded: string
  } | null
  climate: { summary: string } | null
  holiday: { method: string; voltage: string; result: string } | null
  cure: string[]
  adhesion: string[]
  nonconformances: {
    number: string
    defect: string
    disposition: string
    concessionRef: string | null
    closed: boolean
  }[]
  statement: string
  inspectedBy: { name: string; date: string }[]
  approvedBy: { name: string; date: string }
  /** When the plant allows the recorder to release (small shops), the certificate says so. */
  independenceNote: string | null
  /** Reissue: the number this certificate replaces. */
  supersedes: string | null
}

/* Answers of the routes above (added by the certificate feature). */

export const certificateListQuerySchema = z.object({
  /** Order, lot, part or heat number, or the certificate number; part of it is enough. */
  q: z.string().trim().max(100).optional(),
  customerId: z.coerce.number().int().positive().max(2147483647).optional(),
  state: z.enum(['valid', 'superseded', 'revoked']).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
})
export const resendSchema = z.object({
  /** One recipient's delivery; without it every recipient of the certificate gets it again. */
  deliveryId: z.coerce.number().int().positive().optional(),
})

export const CERTIFICATE_STATE_LABELS: Record<CertificateState, string> = {
  valid: 'Valid',
  superseded: 'Replaced by a reissue',
  revoked: 'Withdrawn',
}

export interface CertificateRow {
  id: number
  number: string
  kind: CertificateKind
  state: CertificateState
  issuedAt: string
  lotId: number
  lotNumber: string
  customerId: number
  customerName: string
  orderRef: string
  partNumbers: string[]
  heatNumbers: string[]
  /** SHA-256 of the PDF file as issued. */
  fingerprint: string
  needsReissue: boolean
}

export interface DeliveryRow {
  id: number
  kind: DeliveryKind
  recipientName: string
  recipientEmail: string
  state: DeliveryState
  /** 'sending' shows as queued: the worker holds it for a moment. */
  attempts: number
  lastError: string | null
  queuedAt: string
  lastAttemptAt: string | null
  nextAttemptAt: string | null
  sentAt: string | null
}

export interface CertificateDetail extends CertificateRow {
  /** SHA-256 of the certificate data, printed in the PDF's footer. */
  contentFingerprint: string
  verifyCode: string
  verifyUrl: string
  issuedBy: string
  supersedes: { id: number; number: string; reason: string } | null
  supersededBy: { id: number; number: string; at: string } | null
  revoked: { at: string; reason: string; byName: string } | null
  /** Staff only: customers are not shown the plant's mail log. */
  deliveries: DeliveryRow[] | null
}

/** A released lot that has no valid certificate yet (the Certificates page's "to issue" list). */
export interface LotToCertify {
  lotId: number
  lotNumber: string
  customerName: string
  orderRef: string
  partCount: number
  releasedAt: string
  releasedBy: string
  /** The lot had a certificate that was withdrawn. */
  hadRevoked: boolean
}

/** GET /api/verify/:code — what anyone holding the certificate may learn, and nothing more. */
export interface VerifyResult {
  state: CertificateState
  number: string
  issuedAt: string
  lotNumber: string
  /** SHA-256 of the PDF file (compare with `sha256sum`). */
  fingerprint: string
  /** SHA-256 printed in the PDF's footer. */
  contentFingerprint: string
  successor: { verifyCode: string; verifyUrl: string } | null
  revokedAt: string | null
}

/** Who reads certificates: QA, the plant manager, the administrator, and customers (their own). */
export const CERTIFICATE_STAFF = [
  'supervisor',
  'manager',
  'admin',
] as const satisfies readonly Role[]
export const CERTIFICATE_READERS = [
  ...CERTIFICATE_STAFF,
  'customer',
] as const satisfies readonly Role[]
