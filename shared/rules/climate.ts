/**
 * Climate at the time of coating.
 * - Dew point: Magnus formula with coefficients 17.62 and 243.12 °C (TRADE.md §5 [R]).
 * - Gate: steel at least 3 °C above the dew point and RH not above 85 % unless the coating maker
 *   allows it (ISO 8502-4 guidance, ISO 12944-7 [R]). Both limits come from the spec
 *   (`climate.minSteelAboveDewPointC`, `climate.maxRelativeHumidityPct`); these are the defaults.
 */
import { atLeast, atMost, requireRange, RuleInputError } from './errors'
import { formatC, formatNumber } from './format'

export const MAGNUS_B = 17.62
export const MAGNUS_C_C = 243.12
export const DEFAULT_MIN_MARGIN_C = 3
export const DEFAULT_MAX_RH_PCT = 85

export interface ClimateReading {
  airTempC: number
  relativeHumidityPct: number
  steelTempC: number
}

export interface ClimateLimits {
  minMarginC?: number
  maxRelativeHumidityPct?: number
}

export interface ClimateCheck {
  dewPointC: number
  marginC: number
  pass: boolean
  reasons: string[]
}

/**
 * Dew point (°C) by Magnus: γ = ln(RH/100) + 17.62·T/(243.12 + T); Td = 243.12·γ/(17.62 − γ).
 * RH must be above 0 (the dew point of perfectly dry air is undefined) and at most 100 %;
 * air temperature −60 … 80 °C (Magnus is fitted for about −45 … 60 °C).
 */
export function dewPointC(airTempC: number, relativeHumidityPct: number): number {
  const t = requireRange(airTempC, 'airTempC', -60, 80, ' °C')
  const rh = requireRange(relativeHumidityPct, 'relativeHumidityPct', 0, 100, ' %')
  if (rh === 0) {
    throw new RuleInputError('relativeHumidityPct', 'must be above 0 % (dry air has no dew point)')
  }
  const gamma = Math.log(rh / 100) + (MAGNUS_B * t) / (MAGNUS_C_C + t)
  return (MAGNUS_C_C * gamma) / (MAGNUS_B - gamma)
}

/**
 * ISO 8502-4 / ISO 12944-7 gate: pass when steel − dew point ≥ minMarginC (default 3 °C) and
 * RH ≤ maxRelativeHumidityPct (default 85 %). Exactly at a limit passes; the comparison allows
 * only floating-point noise (see errors.ts). Steel temperature −60 … 300 °C (preheated parts).
 * `reasons` is empty when the reading passes.
 */
export function checkClimate(reading: ClimateReading, limits: ClimateLimits = {}): ClimateCheck {
  const dp = dewPointC(reading.airTempC, reading.relativeHumidityPct)
  const steelTempC = requireRange(reading.steelTempC, 'steelTempC', -60, 300, ' °C')
  const minMarginC = requireRange(
    limits.minMarginC ?? DEFAULT_MIN_MARGIN_C,
    'minMarginC',
    0,
    30,
    ' °C',
  )
  const maxRh = requireRange(
    limits.maxRelativeHumidityPct ?? DEFAULT_MAX_RH_PCT,
    'maxRelativeHumidityPct',
    0,
    100,
    ' %',
  )
  const marginC = steelTempC - dp
  const reasons: string[] = []
  if (!atLeast(marginC, minMarginC)) {
    reasons.push(
      `Steel ${formatC(steelTempC)} is only ${formatNumber(marginC, 2)} °C above the dew point ` +
        `${formatNumber(dp, 2)} °C; at least ${formatNumber(minMarginC, 1)} °C is required ` +
        `(steel must be ${formatNumber(dp + minMarginC, 2)} °C or warmer).`,
    )
  }
  if (!atMost(reading.relativeHumidityPct, maxRh)) {
    reasons.push(
      `Relative humidity ${formatNumber(reading.relativeHumidityPct, 1)} % is above the ` +
        `${formatNumber(maxRh, 0)} % limit.`,
    )
  }
  return { dewPointC: dp, marginC, pass: reasons.length === 0, reasons }
}
