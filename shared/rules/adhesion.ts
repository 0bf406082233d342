/**
 * Adhesion checks (TRADE.md §6).
 * - ASTM D3359 [R]: Method A X-cut grades 5A–0A; Method B cross-cut 5B–0B by % area removed:
 *   5B none; 4B < 5 %; 3B 5–15 %; 2B 15–35 %; 1B 35–65 %; 0B > 65 %. The published bands share
 *   their edges; since 4B is "less than 5" and 0B "greater than 65", each band here includes its
 *   lower edge: 5 % → 3B, 15 % → 2B, 35 % → 1B, 65 % → 1B.
 * - ISO 2409 classes 0/1/2/3 ≈ 5B/4B/3B/2B [R] (4 ≈ 1B and 5 ≈ 0B [M]).
 * - ASTM D6677 knife adhesion 0–10, 10 best [R].
 * - ASTM D4541 pull-off [R]: every pull must reach the spec minimum (MPa). A pull that broke in the
 *   glue below the minimum did not measure the coating: it must be repeated (incomplete).
 */
import { atLeast, requireRange, RuleInputError } from './errors'
import { formatNumber } from './format'

export type D3359Method = 'A' | 'B'

/** Parse "4B" / "3A" → { grade: 4, method: 'B' }. */
export function parseD3359Grade(grade: string): {
  grade: number
  method: D3359Method
} {
  const m = /^\s*([0-5])\s*([AB])\s*$/i.exec(String(grade))
  if (!m)
    throw new RuleInputError(
      'adhesion.crossCut.grade',
      `must be 5B…0B or 5A…0A (got ${String(grade)})`,
    )
  return { grade: Number(m[1]), method: m[2]!.toUpperCase() as D3359Method }
}

/** ASTM D3359 Method B grade (0–5) from % of the lattice area removed. */
export function d3359GradeFromPercentRemoved(percentRemoved: number): number {
  const p = requireRange(percentRemoved, 'percentRemoved', 0, 100, ' %')
  if (p === 0) return 5
  if (p < 5) return 4
  if (p < 15) return 3
  if (p < 35) return 2
  if (p <= 65) return 1
  return 0
}

/** ISO 2409 classification → ASTM D3359 Method B grade number. */
export function iso2409ToD3359(isoClass: number): number {
  if (!Number.isInteger(isoClass) || isoClass < 0 || isoClass > 5) {
    throw new RuleInputError('isoClass', `must be 0–5 (got ${String(isoClass)})`)
  }
  return 5 - isoClass
}

export interface AdhesionOutcome {
  status: 'pass' | 'fail' | 'incomplete'
  reason: string
}

export function checkCrossCut(
  spec: { method: D3359Method; minGrade: number },
  record: { grade?: string; percentRemoved?: number },
): AdhesionOutcome {
  let parsed: { grade: number; method: D3359Method }
  if (record.grade !== undefined) parsed = parseD3359Grade(record.grade)
  else if (record.percentRemoved !== undefined) {
    parsed = {
      grade: d3359GradeFromPercentRemoved(record.percentRemoved),
      method: 'B',
    }
  } else return { status: 'incomplete', reason: 'ASTM D3359 grade not recorded.' }
  const label = `${parsed.grade}${parsed.method}`
  const min = `${spec.minGrade}${spec.method}`
  if (parsed.method !== spec.method) {
    return {
      status: 'fail',
      reason: `ASTM D3359 method ${parsed.method} recorded (${label}); the spec asks for method ${spec.method}.`,
    }
  }
  if (parsed.grade < spec.minGrade)
    return {
      status: 'fail',
      reason: `ASTM D3359 ${label} is below the minimum ${min}.`,
    }
  return { status: 'pass', reason: `ASTM D3359 ${label} meets ${min}.` }
}

export function checkKnife(
  spec: { minRating: number },
  record: { rating: number },
): AdhesionOutcome {
  const r = requireRange(record.rating, 'adhesion.knife.rating', 0, 10)
  if (r < spec.minRating)
    return {
      status: 'fail',
      reason: `ASTM D6677 knife rating ${r} is below the minimum ${spec.minRating}.`,
    }
  return {
    status: 'pass',
    reason: `ASTM D6677 knife rating ${r} meets ${spec.minRating}.`,
  }
}

export interface PullOffRecord {
  valueMPa: number
  /** Share of the fracture in the glue, % (D4541 fracture nature). */
  gluePct?: number
  fracture?: string
}

export function checkPullOff(spec: { minMPa: number }, pulls: PullOffRecord[]): AdhesionOutcome {
  if (pulls.length === 0)
    return { status: 'incomplete', reason: 'No ASTM D4541 pull-off recorded.' }
  const low: string[] = []
  const glue: string[] = []
  pulls.forEach((p, i) => {
    const v = requireRange(p.valueMPa, `adhesion.pullOff.pulls[${i}].valueMPa`, 0, 200, ' MPa')
    const gluePct =
      p.gluePct === undefined
        ? 0
        : requireRange(p.gluePct, `adhesion.pullOff.pulls[${i}].gluePct`, 0, 100, ' %')
    if (atLeast(v, spec.minMPa)) return
    if (gluePct >= 100) glue.push(`pull ${i + 1} (${formatNumber(v, 2)} MPa, glue failure)`)
    else low.push(`pull ${i + 1} ${formatNumber(v, 2)} MPa`)
  })
  if (low.length)
    return {
      status: 'fail',
      reason: `ASTM D4541 below the ${formatNumber(spec.minMPa, 2)} MPa minimum: ${low.join(', ')}.`,
    }
  if (glue.length)
    return {
      status: 'incomplete',
      reason: `Repeat the pull-off: ${glue.join(', ')} did not test the coating.`,
    }
  const lowest = Math.min(...pulls.map((p) => p.valueMPa))
  return {
    status: 'pass',
    reason: `ASTM D4541 lowest pull ${formatNumber(lowest, 2)} MPa meets ${formatNumber(spec.minMPa, 2)} MPa.`,
  }
}
