/**
 * Capability indices and their plain-language reading, from aggregates the database computed
 * (mean, σ). Same formulas as shared/rules/statistics.ts (TRADE.md §8 [R]); the tests check that
 * the two agree on the same values.
 */
import type { CapabilityIndices } from '../../../shared/api/trends'
import { SPREAD_NOISE_FRACTION } from '../../../shared/rules/statistics'
import { formatNumber } from './format'

export function indicesFrom(
  meanUm: number,
  sigmaUm: number | null,
  lslUm: number,
  uslUm: number | null,
): CapabilityIndices {
  const out: CapabilityIndices = { cp: null, cpk: null, cpl: null, cpu: null }
  const noiseUm = SPREAD_NOISE_FRACTION * Math.max(1, Math.abs(meanUm))
  if (sigmaUm === null || !Number.isFinite(sigmaUm) || !(sigmaUm > noiseUm)) return out
  out.cpl = (meanUm - lslUm) / (3 * sigmaUm)
  if (uslUm !== null) {
    out.cpu = (uslUm - meanUm) / (3 * sigmaUm)
    out.cp = (uslUm - lslUm) / (6 * sigmaUm)
  }
  out.cpk = out.cpu === null ? out.cpl : Math.min(out.cpl, out.cpu)
  return out
}

/** Usual shop thresholds [P]: 1.33 is "capable", under 1.0 the band cannot hold the process. */
export const CAPABLE = 1.33
export const NOT_CAPABLE = 1.0
/** Below this many parts the reading says the indices are only indicative [P]. */
export const FEW_PARTS = 30

const f2 = (v: number) => formatNumber(v, 2)

/**
 * One sentence per finding, for a plant manager: which side limits, whether the spread or the
 * centring is the problem, and whether the process drifts between subgroups (Pp well below Cp).
 */
export function capabilityReading(input: {
  n: number
  meanUm: number
  lslUm: number
  uslUm: number | null
  within: CapabilityIndices
  overall: CapabilityIndices
}): string[] {
  const { n, within, overall, uslUm } = input
  const out: string[] = []
  if (n < 2) return ['Fewer than two measured parts: no spread to judge yet.']
  if (n < FEW_PARTS) out.push(`Only ${n} parts: read the indices as indicative, not as proof.`)
  // Cp/Cpk when there are subgroups, otherwise the overall indices.
  const useWithin = within.cpk !== null
  const idx = useWithin ? within : overall
  const [k, l, u, p] = useWithin ? ['Cpk', 'Cpl', 'Cpu', 'Cp'] : ['Ppk', 'Ppl', 'Ppu', 'Pp']
  if (idx.cpk === null) return [...out, 'No spread in the part means: the indices are not defined.']
  const thinSide = idx.cpu === null || (idx.cpl !== null && idx.cpl <= idx.cpu)
  if (idx.cpk >= CAPABLE) {
    out.push(`Capable: ${k} ${f2(idx.cpk)} — the band holds the process with room to spare.`)
  } else if (thinSide) {
    out.push(`The process runs thin: ${l} ${f2(idx.cpl!)} — parts come too close to the minimum.`)
  } else {
    out.push(
      `The process runs thick: ${u} ${f2(idx.cpu!)} — parts come too close to the maximum (and use more powder).`,
    )
  }
  if (idx.cp !== null && idx.cpk < CAPABLE) {
    if (idx.cp < NOT_CAPABLE) {
      out.push(
        `The spread is wider than the band (${p} ${f2(idx.cp)}): centring alone will not fix it; reduce the variation.`,
      )
    } else if (idx.cp >= CAPABLE) {
      out.push(
        `The spread would fit (${p} ${f2(idx.cp)}); the mean is off centre — re-centre the film build.`,
      )
    }
  }
  if (uslUm === null) out.push('The spec sets no maximum: only the lower side is judged.')
  if (within.cp !== null && overall.cp !== null && overall.cp < 0.8 * within.cp) {
    out.push(
      `Pp ${f2(overall.cp)} is well below Cp ${f2(within.cp)}: the process drifts between subgroups — look at shifts, batches and oven changes over time.`,
    )
  } else if (within.cpk !== null && overall.cpk !== null && overall.cpk < 0.8 * within.cpk) {
    out.push(
      `Ppk ${f2(overall.cpk)} is well below Cpk ${f2(within.cpk)}: the mean moves between subgroups — look for shifts over time.`,
    )
  }
  return out
}
