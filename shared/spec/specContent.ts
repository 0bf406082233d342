import { z } from 'zod'

/**
 * The content of one coating-spec version. Every number is stored in micrometres and °C;
 * `bandUnit` only says how the spec itself writes its band (for display and certificates).
 * Values tagged [M] in TRADE.md (from memory) are fields here, never constants in code.
 */

/** Cleanliness grades, least to most thorough. SSPC ⇄ ISO 8501-1 pairs per TRADE.md §4 [R]. */
export const CLEANLINESS_GRADES = [
  'SSPC-SP7/Sa1',
  'SSPC-SP6/Sa2',
  'SSPC-SP14',
  'SSPC-SP10/Sa2.5',
  'SSPC-SP5/Sa3',
] as const
export type CleanlinessGrade = (typeof CLEANLINESS_GRADES)[number]

export const PA2_LEVELS = [1, 2, 3, 4, 5] as const
export type Pa2Level = (typeof PA2_LEVELS)[number]

export const THICKNESS_RULES = ['SSPC-PA2', 'ISO-19840'] as const
export const PROFILE_METHODS = ['A-comparator', 'B-depth-micrometer', 'C-replica-tape'] as const
export const HOLIDAY_VOLTAGE_RULES = ['NACE-SP0490', 'NACE-SP0274', 'fixed'] as const
export const HOLIDAY_METHODS = ['by-thickness', 'low-voltage', 'high-voltage'] as const

const um = z.number().finite().min(0).max(10000)
const tempC = z.number().finite().min(-50).max(400)

export const thicknessSpecSchema = z
  .object({
    rule: z.enum(THICKNESS_RULES),
    bandUnit: z.enum(['um', 'mil']).default('um'),
    /** SSPC-PA 2: specified minimum and maximum. ISO 19840: minUm is the NDFT. */
    minUm: um,
    maxUm: um.nullable(),
    /** SSPC-PA 2 restriction level; level 3 when a spec names none (PA 2 §9). */
    pa2Level: z.union(PA2_LEVELS.map((l) => z.literal(l))).default(3),
    /** ISO 19840: true = "at most 20 %" of readings between 80 % and 100 % NDFT; false = "under 20 %". */
    isoAllowExactly20Pct: z.boolean().default(false),
    /** ISO 19840 profile correction subtracted when the gauge was adjusted on smooth steel [M]. */
    isoProfileCorrectionUm: um.default(0),
  })
  .refine((t) => t.maxUm === null || t.maxUm >= t.minUm, {
    message: 'The maximum thickness must not be below the minimum',
    path: ['maxUm'],
  })

export const surfacePrepSpecSchema = z.object({
  grade: z.enum(CLEANLINESS_GRADES),
  profileMethod: z.enum(PROFILE_METHODS),
  profileMinUm: um,
  profileMaxUm: um,
  /** ASTM D4417 Method C: re-test with the other tape grade in the 1.5–2.5 mil overlap (older procedure). */
  replicaOverlapRetest: z.boolean().default(false),
})

export const climateSpecSchema = z.object({
  minSteelAboveDewPointC: z.number().finite().min(0).max(30).default(3),
  maxRelativeHumidityPct: z.number().finite().min(1).max(100).default(85),
})

export const holidaySpecSchema = z.object({
  required: z.boolean().default(true),
  method: z.enum(HOLIDAY_METHODS).default('by-thickness'),
  voltageRule: z.enum(HOLIDAY_VOLTAGE_RULES).default('NACE-SP0490'),
  /** Used when voltageRule is 'fixed' (the spec's own voltage), and for wet-sponge tests. */
  fixedVoltageV: z.number().finite().min(1).max(40000).nullable().default(null),
  /** How far the voltage used may stray from the required voltage, ± % [P]. */
  voltageTolerancePct: z.number().finite().min(0).max(50).default(5),
  /** Edition of the standard the voltage rule follows (NACE SP0188 changed in 2024). */
  standardEdition: z.string().max(60).default(''),
})

export const cureSpecSchema = z.object({
  solventRub: z
    .object({ solvent: z.string().min(1).max(60), minDoubleRubs: z.number().int().min(1).max(1000) })
    .nullable()
    .default(null),
  dsc: z
    .object({ minDeltaTgC: z.number().finite().min(-50).max(50), maxDeltaTgC: z.number().finite().min(-50).max(50) })
    .nullable()
    .default(null),
  oven: z
    .object({ minTempC: tempC, maxTempC: tempC, minMinutes: z.number().min(0).max(10000), maxMinutes: z.number().min(0).max(10000) })
    .nullable()
    .default(null),
})

export const adhesionSpecSchema = z.object({
  /** ASTM D3359: method A (X-cut, grades 5A–0A) or B (cross-cut, 5B–0B); minimum grade number. */
  crossCut: z.object({ method: z.enum(['A', 'B']), minGrade: z.number().int().min(0).max(5) }).nullable().default(null),
  /** ASTM D6677 knife adhesion, 0–10 (10 best). */
  knife: z.object({ minRating: z.number().int().min(0).max(10) }).nullable().default(null),
  /** ASTM D4541 pull-off, minimum in MPa. */
  pullOff: z.object({ minMPa: z.number().finite().min(0).max(100) }).nullable().default(null),
})

export const samplingSpecSchema = z.object({
  /** 'every-part': each part is inspected; 'sample': `sampleSize` parts per lot. */
  mode: z.enum(['every-part', 'sample']).default('every-part'),
  sampleSize: z.number().int().min(1).max(1000).default(1),
})

export const specContentSchema = z.object({
  coatingType: z.enum(['FBE', 'liquid-epoxy', 'primer']),
  thickness: thicknessSpecSchema,
  surfacePrep: surfacePrepSpecSchema,
  climate: climateSpecSchema,
  holiday: holidaySpecSchema,
  cure: cureSpecSchema,
  adhesion: adhesionSpecSchema,
  sampling: samplingSpecSchema,
  notes: z.string().max(4000).default(''),
})

export type SpecContent = z.infer<typeof specContentSchema>
export type ThicknessSpec = z.infer<typeof thicknessSpecSchema>
export type SurfacePrepSpec = z.infer<typeof surfacePrepSpecSchema>
export type ClimateSpec = z.infer<typeof climateSpecSchema>
export type HolidaySpec = z.infer<typeof holidaySpecSchema>
export type CureSpec = z.infer<typeof cureSpecSchema>
export type AdhesionSpec = z.infer<typeof adhesionSpecSchema>
