/**
 * A compact before → after of an audit event: only the fields that changed, each value cut to
 * a readable length. A creation lists what was set; a deletion what was there.
 */
export interface DiffLine {
  field: string
  before: string | null
  after: string | null
}

const MAX = 80

/** Record ids (decisionId, readingIds, ...) are in the event's record column and note already. */
const NOISE = /(^id$|Ids?$)/

/** "independenceWaived" → "independence waived". */
export function fieldWords(key: string): string {
  return key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase()
}

function isStamp(v: unknown): v is { byName: string; at: string } {
  return isRecord(v) && typeof v.byName === 'string' && typeof v.at === 'string'
}

function show(v: unknown): string {
  if (v === null || v === undefined) return '—'
  if (v === '') return '(empty)'
  if (typeof v === 'string') return v.length > MAX ? `${v.slice(0, MAX - 1)}…` : v
  if (isStamp(v)) {
    const at = new Date(v.at).toLocaleString([], { dateStyle: 'medium', timeStyle: 'short' })
    return `${v.byName}, ${at}`
  }
  if (typeof v === 'number' || typeof v === 'boolean') return String(v)
  const json = JSON.stringify(v)
  return json.length > MAX ? `${json.slice(0, MAX - 1)}…` : json
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v)
}

export function auditDiff(
  before: unknown,
  after: unknown,
  limit = 8,
): { lines: DiffLine[]; more: number } {
  let lines: DiffLine[]
  if (isRecord(before) && isRecord(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])]
    lines = keys
      .filter((k) => !NOISE.test(k) && JSON.stringify(before[k]) !== JSON.stringify(after[k]))
      .map((k) => ({
        field: k,
        before: k in before ? show(before[k]) : null,
        after: k in after ? show(after[k]) : null,
      }))
  } else if (isRecord(after) && (before === null || before === undefined)) {
    lines = Object.entries(after)
      .filter(([k]) => !NOISE.test(k))
      .map(([k, v]) => ({ field: k, before: null, after: show(v) }))
  } else if (isRecord(before) && (after === null || after === undefined)) {
    lines = Object.entries(before)
      .filter(([k]) => !NOISE.test(k))
      .map(([k, v]) => ({ field: k, before: show(v), after: null }))
  } else if (before === null && after === null) {
    lines = []
  } else {
    lines = [{ field: 'value', before: show(before), after: show(after) }]
  }
  lines = lines.map((l) => ({ ...l, field: fieldWords(l.field) }))
  return { lines: lines.slice(0, limit), more: Math.max(0, lines.length - limit) }
}
