/**
 * The whole inspection record of one part, as the tablet sends it and the server stores it.
 * Plain JSON: objects, arrays, numbers in µm / °C / MPa / V. Every section is optional while the
 * inspection is in progress; a missing section makes its criterion 'incomplete'.
 * `partInspectionInputSchema` validates it; `evaluatePart` runs the schema first and reports the
 * first bad field as a RuleInputError.
 */
import { z } from 'zod'
import { CLEANLINESS_GRADES, PROFILE_METHODS, type CleanlinessGrade } from '../spec/specContent'
import type { ProfileLocationInput, ProfileMethod } from './surfacePrep'
import type { HolidayFinding, HolidayMethod } from './holiday'
import type { PullOffRecord } from './adhesion'

export interface ThicknessSpotInput {
  /** Gauge readings in µm as read (the BMR is subtracted by the rules for a type-1 gauge). */
  readingsUm: number[]
  label?: string
}

export interface ThicknessAreaInput {
  spots: ThicknessSpotInput[]
  label?: string
}

export interface PartInspectionInput {
  surfacePrep?: {
    gradeRecorded: CleanlinessGrade | null
    /** Defaults to the spec's method. */
    profileMethod?: ProfileMethod
    profileLocations: ProfileLocationInput[]
  }
  climate?: {
    airTempC: number
    relativeHumidityPct: number
    steelTempC: number
    recordedAt?: string
  }
  thickness?: {
    /** ASTM D7091: type 1 magnetic pull-off (needs a BMR) or type 2 electronic. */
    gaugeType: 'type-1' | 'type-2'
    /** Type 1: ~10 bare-substrate readings; their mean is the base metal reading. */
    baseMetalReadingsUm?: number[]
    /** Type 1: the BMR itself when only the mean was written down. */
    baseMetalReadingUm?: number
    /** The gauge failed its post-measurement check: every reading since the last good check is suspect. */
    suspectReadings?: boolean
    /** SSPC-PA 2: areas → spots → readings. */
    areas?: ThicknessAreaInput[]
    /** ISO 19840: all readings of the inspection area. */
    readingsUm?: number[]
  }
  holiday?: {
    method: HolidayMethod
    voltageUsedV: number | null
    /** Thickness the voltage was set for; default the part's measured mean DFT. */
    thicknessBasisUm?: number
    holidays: HolidayFinding[]
  }
  cure?: {
    solventRub?: {
      solvent: string
      doubleRubs: number
      coatingRemoved: boolean
    }
    dsc?: { deltaTgC: number }
    oven?: { tempC: number; minutes: number }
  }
  adhesion?: {
    crossCut?: { grade?: string; percentRemoved?: number }
    knife?: { rating: number }
    pullOff?: { pulls: PullOffRecord[] }
  }
  notes?: string
}

const um = z.number().finite().min(0).max(10000)
const label = z.string().max(120).optional()
const tempC = z.number().finite().min(-60).max(300)

export const partInspectionInputSchema = z.object({
  surfacePrep: z
    .object({
      gradeRecorded: z.enum(CLEANLINESS_GRADES).nullable(),
      profileMethod: z.enum(PROFILE_METHODS).optional(),
      profileLocations: z
        .array(
          z.object({
            readingsUm: z.array(um).max(100),
            tapeGrade: z.enum(['coarse', 'x-coarse']).optional(),
            retestReadingsUm: z.array(um).max(100).optional(),
          }),
        )
        .max(1000),
    })
    .optional(),
  climate: z
    .object({
      airTempC: z.number().finite().min(-60).max(80),
      relativeHumidityPct: z.number().finite().gt(0).max(100),
      steelTempC: tempC,
      recordedAt: z.string().max(40).optional(),
    })
    .optional(),
  thickness: z
    .object({
      gaugeType: z.enum(['type-1', 'type-2']),
      baseMetalReadingsUm: z.array(um).max(100).optional(),
      baseMetalReadingUm: z.number().finite().min(0).max(1000).optional(),
      suspectReadings: z.boolean().optional(),
      areas: z
        .array(
          z.object({
            label,
            spots: z.array(z.object({ label, readingsUm: z.array(um).max(100) })).max(1000),
          }),
        )
        .max(1000)
        .optional(),
      readingsUm: z.array(um).max(100000).optional(),
    })
    .optional(),
  holiday: z
    .object({
      method: z.enum(['low-voltage', 'high-voltage']),
      voltageUsedV: z.number().finite().gt(0).max(40000).nullable(),
      thicknessBasisUm: z.number().finite().gt(0).max(10000).optional(),
      holidays: z
        .array(
          z.object({
            found: z.boolean(),
            repaired: z.boolean(),
            retested: z.boolean(),
            location: label,
          }),
        )
        .max(10000),
    })
    .optional(),
  cure: z
    .object({
      solventRub: z
        .object({
          solvent: z.string().min(1).max(60),
          doubleRubs: z.number().int().min(0).max(100000),
          coatingRemoved: z.boolean(),
        })
        .optional(),
      dsc: z.object({ deltaTgC: z.number().finite().min(-100).max(100) }).optional(),
      oven: z
        .object({
          tempC: z.number().finite().min(-50).max(400),
          minutes: z.number().finite().min(0).max(10000),
        })
        .optional(),
    })
    .optional(),
  adhesion: z
    .object({
      crossCut: z
        .object({
          grade: z
            .string()
            .regex(/^\s*[0-5]\s*[ABab]\s*$/)
            .optional(),
          percentRemoved: z.number().finite().min(0).max(100).optional(),
        })
        .optional(),
      knife: z.object({ rating: z.number().int().min(0).max(10) }).optional(),
      pullOff: z
        .object({
          pulls: z
            .array(
              z.object({
                valueMPa: z.number().finite().min(0).max(200),
                gluePct: z.number().finite().min(0).max(100).optional(),
                fracture: z.string().max(120).optional(),
              }),
            )
            .max(100),
        })
        .optional(),
    })
    .optional(),
  notes: z.string().max(4000).optional(),
}) satisfies z.ZodType<PartInspectionInput>

export interface PartInfo {
  /** Coated surface area of the part, ft² (the spec's sampling rule needs it). */
  coatedAreaFt2?: number | null
  /** Serial / tag shown in lot summaries. */
  label?: string
}
