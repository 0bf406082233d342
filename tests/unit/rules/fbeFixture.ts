/** A conforming FBE valve-body record at the invented plant "Harrowgate Flow Works". */
import { specContentSchema, type SpecContent } from '../../../shared/spec/specContent'
import { milsToMicrons as mil, type PartInspectionInput } from '../../../shared/rules/index'

export function fbeSpec(overrides: Partial<Record<keyof SpecContent, unknown>> = {}): SpecContent {
  return specContentSchema.parse({
    coatingType: 'FBE',
    // 12–20 mils, a common FBE band on valves and fittings [P]; PA 2 level 3 (default)
    thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: mil(12), maxUm: mil(20), pa2Level: 3 },
    // SP 10 / Sa 2½ and a 1.5–4 mil profile, usual for FBE [M]
    surfacePrep: {
      grade: 'SSPC-SP10/Sa2.5',
      profileMethod: 'C-replica-tape',
      profileMinUm: mil(1.5),
      profileMaxUm: mil(4),
    },
    climate: {},
    // FBE: high-voltage spark at NACE SP0490 525 √T [M]
    holiday: {
      method: 'high-voltage',
      voltageRule: 'NACE-SP0490',
      standardEdition: 'NACE SP0490-2007',
    },
    // ΔTg window −2…+3 °C [M]; oven window from the powder maker's data sheet [P]
    cure: {
      dsc: { minDeltaTgC: -2, maxDeltaTgC: 3 },
      oven: { minTempC: 200, maxTempC: 245, minMinutes: 2, maxMinutes: 10 },
    },
    adhesion: { knife: { minRating: 8 }, pullOff: { minMPa: 6.9 } },
    sampling: {},
    ...overrides,
  })
}

const BMR_UM = 20
/** Type-1 readings: film + base metal reading. */
const spotAt = (mils: number) => ({ readingsUm: [0, 0, 0].map(() => mil(mils) + BMR_UM) })

export function fbeInput(): PartInspectionInput {
  return {
    surfacePrep: {
      gradeRecorded: 'SSPC-SP10/Sa2.5',
      profileMethod: 'C-replica-tape',
      // X-Coarse tape, micrometer reading with the 2.0 mil backing → 2.5–3.2 mil profile
      profileLocations: [4.5, 5.0, 5.2].map((m) => ({
        readingsUm: [mil(m)],
        tapeGrade: 'x-coarse' as const,
      })),
    },
    climate: { airTempC: 20, relativeHumidityPct: 60, steelTempC: 18 },
    thickness: {
      gaugeType: 'type-1',
      baseMetalReadingsUm: Array(10).fill(BMR_UM),
      // spots 15, 16, 17, 16, 16 mils → mean 16 mils
      areas: [{ label: 'body', spots: [15, 16, 17, 16, 16].map(spotAt) }],
    },
    holiday: {
      method: 'high-voltage',
      voltageUsedV: 2100,
      holidays: [{ found: true, repaired: true, retested: true, location: 'flange face' }],
    },
    cure: { dsc: { deltaTgC: 1 }, oven: { tempC: 230, minutes: 5 } },
    adhesion: { knife: { rating: 10 }, pullOff: { pulls: [{ valueMPa: 12 }, { valueMPa: 14 }] } },
  }
}
