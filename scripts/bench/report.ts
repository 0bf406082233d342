/** The benchmark's table and JSON (`{ "metrics": [{ name, value, unit, target, pass }] }`). */
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'
import { median } from './load'

export interface MetricDef {
  name: string
  unit: string
  /** e.g. '>= 1000' or '<= 25' */
  target: string
}

export interface Metric extends MetricDef {
  value: number
  pass: boolean
  runs: number[]
}

function meets(value: number, target: string): boolean {
  const [op, limit] = target.split(' ') as ['>=' | '<=', string]
  return op === '>=' ? value >= Number(limit) : value <= Number(limit)
}

/** The median of the runs of each metric, judged against its target. */
export function summarise(defs: MetricDef[], runs: Record<string, number>[]): Metric[] {
  return defs.map((d) => {
    const values = runs.map((r) => r[d.name]).filter((v): v is number => typeof v === 'number')
    const value = Math.round(median(values) * 100) / 100
    return { ...d, value, pass: Number.isFinite(value) && meets(value, d.target), runs: values }
  })
}

export function printTable(metrics: Metric[], note: string) {
  const rows = metrics.map((m) => [
    m.name,
    m.value.toFixed(m.value >= 100 ? 0 : 2),
    m.unit,
    m.target,
    m.pass ? 'pass' : 'MISS',
    m.runs.map((v) => v.toFixed(v >= 100 ? 0 : 2)).join(' / '),
  ])
  const head = ['metric', 'median', 'unit', 'target', '', 'runs']
  const width = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)))
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(width[i]!)).join('  ')
  console.log(`\n${line(head)}\n${width.map((w) => '-'.repeat(w)).join('  ')}`)
  for (const r of rows) console.log(line(r))
  console.log(note)
}

export function writeJson(path: string, metrics: Metric[], extra: Record<string, unknown>) {
  mkdirSync(dirname(path), { recursive: true })
  const out = {
    metrics: metrics.map(({ name, value, unit, target, pass }) => ({
      name,
      value,
      unit,
      target,
      pass,
    })),
    runs: Object.fromEntries(metrics.map((m) => [m.name, m.runs])),
    ...extra,
  }
  writeFileSync(path, `${JSON.stringify(out, null, 2)}\n`)
}
