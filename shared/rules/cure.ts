/**
 * Cure checks (TRADE.md §6). Every limit is a spec field, never a constant:
 * - ASTM D5402 solvent rub: the standard leaves solvent, rub count and pass criterion to the spec
 *   [R]; one double rub = one forward-and-back stroke [R]. Pass: the spec's solvent, at least the
 *   spec's double rubs, and the film not rubbed through / removed.
 * - FBE cure by DSC (CSA Z245.20 method) [R]: ΔTg inside the spec's window (e.g. −2 … +3 °C [M]).
 * - Oven: cure temperature and time inside the powder maker's window (spec fields) [P].
 */
import { atLeast, atMost, requireFinite, requireRange } from './errors'
import { formatC, formatNumber } from './format'

export interface CheckOutcome {
  pass: boolean
  reason: string
}

export function checkSolventRub(
  spec: { solvent: string; minDoubleRubs: number },
  record: { solvent: string; doubleRubs: number; coatingRemoved: boolean },
): CheckOutcome {
  const rubs = requireRange(record.doubleRubs, 'cure.solventRub.doubleRubs', 0, 100000)
  const sameSolvent = record.solvent.trim().toLowerCase() === spec.solvent.trim().toLowerCase()
  if (!sameSolvent) {
    return {
      pass: false,
      reason: `Solvent rub used ${record.solvent}; the spec asks for ${spec.solvent}.`,
    }
  }
  if (rubs < spec.minDoubleRubs) {
    return {
      pass: false,
      reason: `${rubs} double rubs with ${spec.solvent}; the spec asks for ${spec.minDoubleRubs}.`,
    }
  }
  if (record.coatingRemoved) {
    return {
      pass: false,
      reason: `Film rubbed through or removed within ${rubs} double rubs of ${spec.solvent}.`,
    }
  }
  return {
    pass: true,
    reason: `${rubs} double rubs of ${spec.solvent} without removal (spec ${spec.minDoubleRubs}).`,
  }
}

export function checkDsc(
  spec: { minDeltaTgC: number; maxDeltaTgC: number },
  record: { deltaTgC: number },
): CheckOutcome {
  const d = requireRange(record.deltaTgC, 'cure.dsc.deltaTgC', -100, 100, ' °C')
  const window = `${formatNumber(spec.minDeltaTgC, 1)} … ${formatNumber(spec.maxDeltaTgC, 1)} °C`
  if (!atLeast(d, spec.minDeltaTgC) || !atMost(d, spec.maxDeltaTgC)) {
    return {
      pass: false,
      reason: `DSC ΔTg ${formatNumber(d, 1)} °C is outside the ${window} window.`,
    }
  }
  return {
    pass: true,
    reason: `DSC ΔTg ${formatNumber(d, 1)} °C inside ${window}.`,
  }
}

export function checkOven(
  spec: {
    minTempC: number
    maxTempC: number
    minMinutes: number
    maxMinutes: number
  },
  record: { tempC: number; minutes: number },
): CheckOutcome {
  const t = requireRange(record.tempC, 'cure.oven.tempC', -50, 400, ' °C')
  const m = requireRange(
    requireFinite(record.minutes, 'cure.oven.minutes'),
    'cure.oven.minutes',
    0,
    10000,
    ' min',
  )
  const problems: string[] = []
  if (!atLeast(t, spec.minTempC) || !atMost(t, spec.maxTempC)) {
    problems.push(
      `oven ${formatC(t)} outside ${formatC(spec.minTempC)} – ${formatC(spec.maxTempC)}`,
    )
  }
  if (!atLeast(m, spec.minMinutes) || !atMost(m, spec.maxMinutes)) {
    problems.push(`${formatNumber(m, 1)} min outside ${spec.minMinutes} – ${spec.maxMinutes} min`)
  }
  if (problems.length) return { pass: false, reason: `Cure ${problems.join('; ')}.` }
  return {
    pass: true,
    reason: `Oven ${formatC(t)} for ${formatNumber(m, 1)} min inside the spec window.`,
  }
}
