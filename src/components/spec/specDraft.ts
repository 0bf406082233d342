import type { SpecContent } from '@shared/spec/specContent'
import type { SpecVersionRow } from '@shared/api/setup'

/**
 * A spec while it is being typed: every number may still be empty (null). The shared schema
 * turns it into a SpecContent on save (and says which field is missing), so a blank form never
 * carries made-up limits — a spec is the buyer's contract, not ours to guess.
 */
type Loose<T> = T extends number
  ? number | null
  : T extends string | boolean
    ? T
    : T extends object
      ? { [K in keyof T]: Loose<T[K]> }
      : T

export type SpecContentDraft = Loose<SpecContent>
export type ThicknessDraft = SpecContentDraft['thickness']
export type SurfacePrepDraft = SpecContentDraft['surfacePrep']
export type ClimateDraft = SpecContentDraft['climate']
export type HolidayDraft = SpecContentDraft['holiday']
export type CureDraft = SpecContentDraft['cure']
export type AdhesionDraft = SpecContentDraft['adhesion']
export type SamplingDraft = SpecContentDraft['sampling']

export interface SpecDraft {
  code: string
  title: string
  customerId: number | null
  changeNote: string
  content: SpecContentDraft
}

/** Only the defaults the schema itself names (PA 2 level 3, 3 °C margin, 85 % RH, ±5 %). */
export function blankContent(bandUnit: 'um' | 'mil'): SpecContentDraft {
  return {
    coatingType: 'FBE',
    thickness: {
      rule: 'SSPC-PA2',
      bandUnit,
      minUm: null,
      maxUm: null,
      pa2Level: 3,
      isoAllowExactly20Pct: false,
      isoProfileCorrectionUm: 0,
    },
    surfacePrep: {
      grade: 'SSPC-SP10/Sa2.5',
      profileMethod: 'C-replica-tape',
      profileMinUm: null,
      profileMaxUm: null,
      replicaOverlapRetest: false,
    },
    climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
    holiday: {
      required: true,
      method: 'by-thickness',
      voltageRule: 'NACE-SP0490',
      fixedVoltageV: null,
      voltageTolerancePct: 5,
      standardEdition: '',
    },
    cure: { solventRub: null, dsc: null, oven: null },
    adhesion: { crossCut: null, knife: null, pullOff: null },
    sampling: { mode: 'every-part', sampleSize: 1 },
    notes: '',
  }
}

export function draftFromVersion(
  code: string,
  title: string,
  customerId: number | null,
  v: SpecVersionRow,
): SpecDraft {
  // A deep copy: editing the form must not change the loaded version shown beside it.
  return {
    code,
    title,
    customerId,
    changeNote: '',
    content: structuredClone(v.content) as SpecContentDraft,
  }
}
