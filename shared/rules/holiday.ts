/**
 * Holiday (discontinuity) testing (TRADE.md §3).
 * - ASTM D5162: Method A low-voltage wet sponge for films up to 20 mils / 0.5 mm, Method B
 *   high-voltage spark above [R]. The brief and D5162's metric figure put the edge at 500 µm
 *   (20 mils is 508 µm); 500 µm itself is low-voltage.
 * - NACE SP0490 (FBE): V = 525 √T, T in mils [M]; 16 mils → 2,100 V [C].
 * - NACE SP0274 (thick pipeline coatings): V = 1,250 √T for T ≥ 40 mils [R], 525 √T below [M].
 * - A spec may fix its own voltage (voltageRule 'fixed'); NACE SP0188 changed in 2024, so a
 *   spec ties its rule to an edition.
 * CAUTION: high-voltage testers can injure. Every screen that shows a voltage shows
 * HOLIDAY_SAFETY_CAUTION.
 */
import { atLeast, atMost, requirePositive, RuleInputError, MAX_THICKNESS_UM } from './errors'
import { MICRONS_PER_MIL } from './units'

export const HOLIDAY_SAFETY_CAUTION =
  'Caution: high-voltage holiday testers can cause injury. The voltage shown is computed from ' +
  'the spec; the governing standard, the equipment maker’s instructions, local codes and ' +
  'licensed practice take precedence.'

export const LOW_VOLTAGE_MAX_THICKNESS_UM = 500
/** Wet-sponge instruments run about 5–90 V [M — from memory; used only when no voltage is set]. */
export const WET_SPONGE_RANGE_V = { min: 5, max: 90 } as const

export type HolidayMethod = 'low-voltage' | 'high-voltage'
export type HolidayVoltageRule = 'NACE-SP0490' | 'NACE-SP0274'

/** ASTM D5162: low-voltage wet sponge up to 500 µm, high-voltage spark above. */
export function holidayMethod(thicknessUm: number): HolidayMethod {
  const t = requirePositive(thicknessUm, 'thicknessUm', MAX_THICKNESS_UM, ' µm')
  return atMost(t, LOW_VOLTAGE_MAX_THICKNESS_UM) ? 'low-voltage' : 'high-voltage'
}

/**
 * Required spark voltage in whole volts (Math.round): 525 √T (SP0490, and SP0274 below 40 mils)
 * or 1,250 √T (SP0274, T ≥ 40 mils), T = film thickness in mils. 2 mm (78.74 mils) → 11,092 V.
 */
export function holidayTestVoltage(thicknessUm: number, rule: HolidayVoltageRule): number {
  const t = requirePositive(thicknessUm, 'thicknessUm', MAX_THICKNESS_UM, ' µm')
  const mils = t / MICRONS_PER_MIL
  let k: number
  if (rule === 'NACE-SP0490') k = 525
  else if (rule === 'NACE-SP0274') k = atLeast(mils, 40) ? 1250 : 525
  else throw new RuleInputError('rule', `must be NACE-SP0490 or NACE-SP0274 (got ${String(rule)})`)
  return Math.round(k * Math.sqrt(mils))
}

/** Plain-words description of how the required voltage was derived. */
export function holidayVoltageDerivation(thicknessUm: number, rule: HolidayVoltageRule): string {
  const mils = thicknessUm / MICRONS_PER_MIL
  const k = rule === 'NACE-SP0274' && atLeast(mils, 40) ? 1250 : 525
  return `${rule.replace('NACE-', 'NACE ')}: ${k.toLocaleString('en-US')} × √${mils.toFixed(2)} mil`
}

/** |used − required| ≤ tolerancePct % of required (spec `voltageTolerancePct`, default 5 % [P]). */
export function voltageWithinTolerance(
  usedV: number,
  requiredV: number,
  tolerancePct: number,
): boolean {
  const used = requirePositive(usedV, 'voltageUsedV', 40000, ' V')
  const req = requirePositive(requiredV, 'requiredVoltageV', 40000, ' V')
  return atMost(Math.abs(used - req), (req * tolerancePct) / 100)
}

export interface HolidayFinding {
  /** A holiday was detected at this location. */
  found: boolean
  repaired: boolean
  /** Re-tested at the required voltage after repair with no holiday found. */
  retested: boolean
  location?: string
}

/** Holidays still open: found and not repaired, or repaired but not re-tested. */
export function openHolidays(holidays: HolidayFinding[]): {
  unrepaired: number
  notRetested: number
} {
  let unrepaired = 0
  let notRetested = 0
  for (const h of holidays) {
    if (!h.found) continue
    if (!h.repaired) unrepaired++
    else if (!h.retested) notRetested++
  }
  return { unrepaired, notRetested }
}
