/**
 * The numbers behind a criterion (CriterionResult.numbers) as label and value a supervisor
 * reads. The key's suffix names the unit (the rules' convention: µm, °C, V, %, MPa); thickness
 * and temperature follow the person's display units, the rest is shown as stored.
 */
export interface NumberFormatters {
  thickness: (um: number) => string
  temperature: (c: number) => string
  temperatureDelta: (c: number) => string
}

export interface NumberLine {
  key: string
  label: string
  value: string
}

const SUFFIXES: [RegExp, string][] = [
  [/Um$/, ''],
  [/C$/, ''],
  [/V$/, ''],
  [/Pct$/, ''],
  [/Mpa$|MPa$/, ''],
]

function words(key: string): string {
  let k = key
  for (const [re, rep] of SUFFIXES) k = k.replace(re, rep)
  const spaced = k.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase()
  return spaced.charAt(0).toUpperCase() + spaced.slice(1)
}

function plain(n: number): string {
  if (Number.isInteger(n)) return String(n)
  return String(Number(n.toFixed(Math.abs(n) >= 100 ? 1 : 2)))
}

export function formatNumberValue(
  key: string,
  value: number | string | boolean | null,
  f: NumberFormatters,
): string {
  if (value === null) return '—'
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  if (typeof value === 'string') return value
  if (/Um$/.test(key)) return f.thickness(value)
  // A margin or difference in °C converts without the 32° offset.
  if (/C$/.test(key))
    return /margin|delta/i.test(key) ? f.temperatureDelta(value) : f.temperature(value)
  if (/V$/.test(key)) return `${plain(value)} V`
  if (/Pct$/.test(key)) return `${plain(value)} %`
  if (/M[Pp]a$/.test(key)) return `${plain(value)} MPa`
  if (/Minutes$/.test(key)) return `${plain(value)} min`
  return plain(value)
}

export function numberLines(
  numbers: Record<string, number | string | boolean | null>,
  f: NumberFormatters,
): NumberLine[] {
  return Object.entries(numbers).map(([key, value]) => ({
    key,
    label: words(key),
    value: formatNumberValue(key, value, f),
  }))
}
