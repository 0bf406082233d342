/**
 * Western Electric run rules for a control chart (TRADE.md §8 [R]):
 * 1 — one point beyond 3σ; 2 — 2 of 3 consecutive beyond 2σ on one side; 3 — 4 of 5 consecutive
 * beyond 1σ on one side; 4 — 8 in a row on one side of the centre line.
 * "Beyond" is strictly beyond; a point on the centre line is on neither side.
 * Reporting: a violation is reported at the point that completes the pattern, and that point must
 * itself be in the zone. Rule 1 reports every such point. Rules 2–4 report only where the pattern
 * is first completed: while it stays completed at the following points (a longer run), it is not
 * reported again; once broken, a new completion is reported. Near the start of the series fewer
 * points are enough when they already make the pattern (two points beyond 2σ complete rule 2).
 */
import { requireFinite, requirePositive } from './errors'

export interface WesternElectricViolation {
  index: number
  rule: 1 | 2 | 3 | 4
}

export function westernElectricViolations(
  values: number[],
  center: number,
  sigma: number,
): WesternElectricViolation[] {
  requireFinite(center, 'center')
  requirePositive(sigma, 'sigma')
  values.forEach((v, i) => requireFinite(v, `values[${i}]`))
  const z = values.map((v) => (v - center) / sigma)
  const out: WesternElectricViolation[] = []
  const windowRules = [
    { rule: 2 as const, need: 2, of: 3, beyond: 2 },
    { rule: 3 as const, need: 4, of: 5, beyond: 1 },
    { rule: 4 as const, need: 8, of: 8, beyond: 0 },
  ]
  // Whether each rule was completed at the previous point, per side (+1 / −1).
  const wasOn = new Map<string, boolean>()
  z.forEach((zi, i) => {
    if (Math.abs(zi) > 3) out.push({ index: i, rule: 1 })
    for (const r of windowRules) {
      for (const side of [1, -1]) {
        const inZone = (x: number) => side * x > r.beyond
        const from = Math.max(0, i - r.of + 1)
        let hits = 0
        for (let j = from; j <= i; j++) if (inZone(z[j]!)) hits++
        const on = inZone(zi) && hits >= r.need
        const key = `${r.rule}:${side}`
        if (on && !wasOn.get(key)) out.push({ index: i, rule: r.rule })
        wasOn.set(key, on)
      }
    }
  })
  return out.sort((a, b) => a.index - b.index || a.rule - b.rule)
}
