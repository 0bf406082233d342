import { z } from 'zod'
import { ROLES, type Role } from './roles'
import { passwordSchema } from './auth'
import { INSTRUMENT_KINDS, type InstrumentKind } from './instruments'
import { specContentSchema, type SpecContent } from '../spec/specContent'

/**
 * The Setup area's request bodies (zod, used by the server's validation and the client's forms)
 * and response shapes. Routes:
 *   GET/POST /api/users, PATCH /api/users/:id, POST /api/users/:id/reset-password      (admin)
 *   GET /api/customers (staff), GET /api/customers/:id (staff), POST /api/customers (admin),
 *   PATCH /api/customers/:id, POST /api/customers/:id/contacts,
 *   PATCH /api/customers/:id/contacts/:contactId                                         (admin)
 *   GET /api/specs, GET /api/specs/:id, GET /api/specs/:id/versions/:version (staff),
 *   POST /api/specs, PUT /api/specs/:id                                                  (admin)
 *   GET /api/instruments (staff), POST /api/instruments, PATCH /api/instruments/:id     (admin)
 *   GET /api/settings (staff), PUT /api/settings                                         (admin)
 */

const name = z.string().trim().min(1, 'Required').max(200)
const email = z.string().trim().toLowerCase().email('Enter an e-mail address').max(200)
const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD')
  .refine((d) => {
    const parsed = new Date(`${d}T00:00:00Z`)
    return !Number.isNaN(parsed.getTime()) && parsed.toISOString().startsWith(d)
  }, 'No such calendar date')

export const createUserSchema = z
  .object({
    email,
    name,
    role: z.enum(ROLES),
    password: passwordSchema,
    customerId: z.number().int().positive().nullable().optional(),
  })
  .refine((u) => (u.role === 'customer') === (u.customerId != null), {
    message: 'A customer user belongs to exactly one customer company; staff belong to none',
    path: ['customerId'],
  })
export const updateUserSchema = z.object({
  name: name.optional(),
  role: z.enum(ROLES).optional(),
  customerId: z.number().int().positive().nullable().optional(),
  active: z.boolean().optional(),
})
export const resetPasswordSchema = z.object({ password: passwordSchema })

export interface UserRow {
  id: number
  email: string
  name: string
  role: Role
  active: boolean
  customerId: number | null
  customerName: string | null
  lastLoginAt: string | null
  createdAt: string
}

export const contactSchema = z.object({
  name,
  email,
  receivesCertificates: z.boolean().default(true),
  active: z.boolean().default(true),
})
export const createCustomerSchema = z.object({
  name,
  code: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9-]{2,16}$/, 'Use 2–16 letters, digits or dashes'),
  address: z.string().max(1000).default(''),
  thicknessUnit: z.enum(['um', 'mil']).default('um'),
  contacts: z.array(contactSchema).max(50).default([]),
})
export const updateCustomerSchema = z.object({
  name: name.optional(),
  address: z.string().max(1000).optional(),
  thicknessUnit: z.enum(['um', 'mil']).optional(),
  active: z.boolean().optional(),
})
// Written out rather than contactSchema.partial(): zod 4 would fill the defaults in and a PATCH
// of a name would silently reactivate a contact.
export const updateContactSchema = z.object({
  name: name.optional(),
  email: email.optional(),
  receivesCertificates: z.boolean().optional(),
  active: z.boolean().optional(),
})

export interface ContactRow {
  id: number
  name: string
  email: string
  receivesCertificates: boolean
  active: boolean
}
export interface CustomerRow {
  id: number
  name: string
  code: string
  address: string
  thicknessUnit: 'um' | 'mil'
  active: boolean
  contacts: ContactRow[]
}

export const createSpecSchema = z.object({
  code: z.string().trim().min(2).max(40),
  title: name,
  customerId: z.number().int().positive().nullable().default(null),
  content: specContentSchema,
})
export const updateSpecSchema = z.object({
  title: name.optional(),
  content: specContentSchema,
  changeNote: z.string().trim().max(500).default(''),
})

export interface SpecVersionRow {
  version: number
  content: SpecContent
  changeNote: string
  createdAt: string
  createdByName: string | null
  /** Set once a lot uses this version; from then on a change creates a new version. */
  lockedAt: string | null
}
export interface SpecRow {
  id: number
  code: string
  title: string
  customerId: number | null
  customerName: string | null
  currentVersion: number
  active: boolean
  current: SpecVersionRow
}
export interface SpecDetail extends SpecRow {
  versions: SpecVersionRow[]
}

const instrumentFields = {
  kind: z.enum(INSTRUMENT_KINDS),
  serial: z.string().trim().min(1).max(60),
  description: z.string().max(200),
  calibratedOn: isoDate.nullable(),
  calibrationDueOn: isoDate,
  certificateRef: z.string().max(100),
}
export const createInstrumentSchema = z.object({
  ...instrumentFields,
  description: instrumentFields.description.default(''),
  calibratedOn: instrumentFields.calibratedOn.default(null),
  certificateRef: instrumentFields.certificateRef.default(''),
})
// Without defaults (not createInstrumentSchema.partial()): a PATCH must not blank the fields it omits.
export const updateInstrumentSchema = z
  .object(instrumentFields)
  .partial()
  .extend({ active: z.boolean().optional() })

export type CalibrationStatus = 'current' | 'due-soon' | 'overdue'
export interface InstrumentRow {
  id: number
  kind: InstrumentKind
  serial: string
  description: string
  calibratedOn: string | null
  calibrationDueOn: string
  certificateRef: string
  active: boolean
  calibrationStatus: CalibrationStatus
  /** Negative once overdue. */
  daysUntilDue: number
}

/** Plant-wide settings. */
export const settingsSchema = z.object({
  /** Small shops only: the person who recorded a lot's readings may also release it (the certificate says so). */
  allowRecorderToRelease: z.boolean(),
  plantName: z.string().trim().min(1).max(200),
  plantAddress: z.string().max(500),
})
export type PlantSettings = z.infer<typeof settingsSchema>
export const DEFAULT_SETTINGS: PlantSettings = {
  allowRecorderToRelease: false,
  plantName: 'Harrowgate Flow Works — Coating Shop',
  plantAddress: '',
}
