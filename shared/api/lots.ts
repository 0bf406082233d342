import { z } from 'zod'
import { isoDateSchema } from './isoDate'
import { partInspectionInputSchema } from '../rules/partInput'
import type { PartVerdict } from '../rules/evaluatePart'
import type { SpecContent } from '../spec/specContent'

/**
 * Shop floor: lots, parts, inspection sections and gauge readings. Routes (FLOOR = operator,
 * supervisor; reads for all staff):
 *   GET  /api/lots?status&line&customerId&from&to&q&limit&offset        list (q: lot, order, part or heat no.)
 *   POST /api/lots                                                       open a lot (FLOOR)
 *   GET  /api/lots/:id                                                   lot, spec version, parts with verdicts
 *   PATCH /api/lots/:id                                                  edit header while open (FLOOR)
 *   POST /api/lots/:id/parts                                             add a part (FLOOR)
 *   GET  /api/parts/:id                                                  part, its records, readings, verdict, plan
 *   PATCH /api/parts/:id                                                 edit part data (FLOOR)
 *   PUT  /api/parts/:id/sections/:section                                record one section (FLOOR)
 *   POST /api/parts/:id/readings                                         gauge readings, batch, idempotent (FLOOR)
 *   POST /api/readings/:id/discard                                       discard one reading with reason (FLOOR)
 *   POST /api/instruments/:id/verifications                              shift verification (FLOOR)
 *   GET  /api/instruments/:id/verifications                              (staff)
 *   POST /api/parts/:id/photos (multipart: file, caption, clientId)      (FLOOR)
 *   POST /api/lots/:id/photos  (multipart: file, caption, clientId, partId?) a lot-level photo (FLOOR)
 *   GET  /api/photos/:id, /api/photos/:id/thumb                          image bytes (staff)
 * List: answers LotRow[] (newest first) with the total count in the X-Total-Count header.
 * Write answers: lots → LotDetail, parts and sections → PartDetail, readings → ReadingsBatchResult,
 * discard → DiscardResult, verification → VerificationResult, photo → PhotoRow.
 * Every write carries `clientId`, a UUID made on the device: the same write sent twice is stored once
 * (the second answers the stored record with 200).
 */

export const LINES = ['fbe-powder', 'liquid-epoxy'] as const
export type Line = (typeof LINES)[number]
export const LINE_LABELS: Record<Line, string> = {
  'fbe-powder': 'FBE powder line',
  'liquid-epoxy': 'Liquid-epoxy booth',
}
export const SHIFTS = ['1', '2', '3'] as const
export type Shift = (typeof SHIFTS)[number]

/** Lot life cycle. 'open' while inspection goes on; review states are decided in QA review. */
export const LOT_STATUSES = ['open', 'awaiting-review', 'on-hold', 'released', 'rejected'] as const
export type LotStatus = (typeof LOT_STATUSES)[number]

export const SECTIONS = [
  'surface-prep',
  'climate',
  'thickness-gauge',
  'holiday',
  'cure',
  'adhesion',
  'notes',
] as const
export type SectionName = (typeof SECTIONS)[number]

const clientId = z.string().uuid('clientId must be a UUID made on the device')
const isoDate = isoDateSchema
const text = (max: number) => z.string().trim().max(max)

export const partBodySchema = z.object({
  clientId,
  partNumber: text(60).min(1, 'Required'),
  description: text(200).default(''),
  heatNumber: text(60).default(''),
  quantity: z.number().int().min(1).max(100000).default(1),
  /** Coated area per piece, m² (the client converts from ft² when the user works in ft²). */
  coatedAreaM2: z.number().finite().gt(0).max(100000).nullable().default(null),
  /** Spec sampling mode 'sample': only sampled parts are inspected. */
  sampled: z.boolean().default(true),
})
export const updatePartSchema = partBodySchema
  .omit({ clientId: true })
  .partial()
  .extend({ version: z.number().int() })

export const createLotSchema = z.object({
  clientId,
  customerId: z.number().int().positive(),
  orderRef: text(60).min(1, 'Required'),
  specId: z.number().int().positive(),
  line: z.enum(LINES),
  shift: z.enum(SHIFTS),
  coatingMaterial: text(120).min(1, 'Required'),
  batchNumber: text(60).min(1, 'Required'),
  /** An expired batch is refused. */
  batchExpiresOn: isoDate,
  notes: text(2000).default(''),
  parts: z.array(partBodySchema).max(500).default([]),
})
export const updateLotSchema = createLotSchema
  .pick({
    orderRef: true,
    shift: true,
    coatingMaterial: true,
    batchNumber: true,
    batchExpiresOn: true,
    notes: true,
  })
  .partial()
  .extend({ version: z.number().int() })

export const lotListQuerySchema = z.object({
  status: z.enum(LOT_STATUSES).optional(),
  line: z.enum(LINES).optional(),
  customerId: z.coerce.number().int().positive().max(2147483647).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
  q: text(100).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
})

/** The data of each section is the matching part of the rules' PartInspectionInput. */
const shape = partInspectionInputSchema.shape
export const sectionDataSchemas = {
  'surface-prep': shape.surfacePrep.unwrap(),
  climate: shape.climate.unwrap(),
  'thickness-gauge': z.object({
    gaugeType: z.enum(['type-1', 'type-2']),
    baseMetalReadingsUm: z.array(z.number().finite().min(0).max(1000)).max(100).optional(),
    baseMetalReadingUm: z.number().finite().min(0).max(1000).optional(),
  }),
  holiday: shape.holiday.unwrap(),
  cure: shape.cure.unwrap(),
  adhesion: shape.adhesion.unwrap(),
  notes: z.object({ text: z.string().max(4000) }),
} as const
export const sectionBodySchema = z.object({
  clientId,
  instrumentId: z.number().int().positive().nullable().default(null),
  /** Validated against sectionDataSchemas[section] by the server. */
  data: z.unknown(),
})

export const readingSchema = z.object({
  clientId,
  /** SSPC-PA 2: area 1.. and spot 1..; ISO 19840 flat list: area 1, spot 0. */
  areaNo: z.number().int().min(1).max(1000),
  spotNo: z.number().int().min(0).max(1000),
  thicknessUm: z.number().finite().min(0).max(10000),
  instrumentId: z.number().int().positive(),
  /** When the gauge showed it; defaults to the time the server receives it. */
  takenAt: z.string().datetime({ offset: true }).optional(),
})
export const readingsBodySchema = z.object({ readings: z.array(readingSchema).min(1).max(500) })
export const discardReadingSchema = z.object({
  reason: text(300).min(3, 'Say why the reading is discarded'),
})

export const verificationSchema = z.object({
  clientId,
  referenceNominalUm: z.number().finite().gt(0).max(10000),
  toleranceUm: z.number().finite().min(0).max(1000),
  readingUm: z.number().finite().min(0).max(10000),
  /** 'start' / 'end' of shift, or after a suspected knock. */
  occasion: z.enum(['start-of-shift', 'end-of-shift', 'other']).default('start-of-shift'),
})

export interface Stamp {
  byId: number
  byName: string
  at: string
}

export interface ReadingRow {
  id: string
  clientId: string
  round: number
  areaNo: number
  spotNo: number
  thicknessUm: number
  instrumentId: number
  instrumentSerial: string
  suspect: boolean
  discarded: boolean
  discardReason: string | null
  takenAt: string
  recorded: Stamp
}

export interface SectionRecordRow {
  id: number
  clientId: string
  section: SectionName
  round: number
  instrumentId: number | null
  instrumentSerial: string | null
  data: unknown
  recorded: Stamp
}

export interface PartRow {
  id: number
  lotId: number
  partNumber: string
  description: string
  heatNumber: string
  quantity: number
  coatedAreaM2: number | null
  sampled: boolean
  /** 1 at first inspection; a repair or recoat opens round 2, 3, ... */
  round: number
  /** Sections this round carries from the earlier one unless re-recorded (a repair round). */
  carriedSections: SectionName[]
  verdict: PartVerdict | null
  version: number
}

export interface PartDetail extends PartRow {
  lotStatus: LotStatus
  spec: SpecContent
  /** Latest record of each section in the current round (or carried from an earlier round). */
  sections: Partial<Record<SectionName, SectionRecordRow>>
  /** Earlier records, earlier rounds included: nothing is overwritten. */
  history: SectionRecordRow[]
  readings: ReadingRow[]
}

export interface LotRow {
  id: number
  lotNumber: string
  status: LotStatus
  customerId: number
  customerName: string
  orderRef: string
  specId: number
  specCode: string
  specVersion: number
  line: Line
  shift: Shift
  coatingMaterial: string
  batchNumber: string
  batchExpiresOn: string
  partCount: number
  partsPassed: number
  partsFailed: number
  partsIncomplete: number
  opened: Stamp
  version: number
}

export interface LotDetail extends LotRow {
  notes: string
  spec: SpecContent
  parts: PartRow[]
  lotVerdict: { status: 'pass' | 'fail' | 'incomplete'; reason: string }
  photos: PhotoRow[]
}

export interface PhotoRow {
  id: number
  partId: number | null
  caption: string
  width: number
  height: number
  uploaded: Stamp
}

/** Answer of POST /api/parts/:id/readings: 201 when anything new was stored, 200 for a replay. */
export interface ReadingsBatchResult {
  /** The batch's readings as stored, in the order sent. */
  readings: ReadingRow[]
  /** How many were new (0 for a replayed batch). */
  storedCount: number
  partId: number
  partVersion: number
  verdict: PartVerdict
}

/** Answer of POST /api/readings/:id/discard. */
export interface DiscardResult {
  reading: ReadingRow
  partVersion: number
  verdict: PartVerdict
}

export interface VerificationRow {
  id: number
  clientId: string
  instrumentId: number
  instrumentSerial: string
  referenceNominalUm: number
  toleranceUm: number
  readingUm: number
  /** |reading − nominal| ≤ tolerance. */
  passed: boolean
  occasion: 'start-of-shift' | 'end-of-shift' | 'other'
  verified: Stamp
}

/** Answer of POST /api/instruments/:id/verifications. */
export interface VerificationResult {
  verification: VerificationRow
  /** Readings newly marked suspect by a failed verification (0 when it passed). */
  suspectCount: number
  /** Parts whose verdict was recomputed. */
  affectedPartIds: number[]
  /** Lot numbers of released or rejected lots holding suspect readings: their verdicts stay as released; raise a nonconformance. */
  closedLotsAffected: string[]
}
