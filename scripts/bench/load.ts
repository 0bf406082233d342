/**
 * HTTP load with autocannon: a fixed number of concurrent connections for a while, every
 * response time kept so the p95 is exact (autocannon's own summary has no p95).
 */
import autocannon from 'autocannon'

export interface LoadResult {
  requests: number
  non2xx: number
  /** clientIds of the requests answered 2xx (a request cut off at the end is not counted). */
  acknowledged: string[]
  errors: number
  rps: number
  p50Ms: number
  p95Ms: number
  p99Ms: number
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))]!
}

export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  if (s.length === 0) return NaN
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}

export interface LoadOptions {
  url: string
  connections: number
  durationS: number
  /** Called for every request: its path, JSON body and the clientIds it carries. */
  next: () => { path: string; body: string; ids?: string[] }
  headers: Record<string, string>
}

export async function runLoad(o: LoadOptions): Promise<LoadResult> {
  const times: number[] = []
  let non2xx = 0
  const acknowledged: string[] = []
  let finish!: (r: autocannon.Result) => void
  let fail!: (err: unknown) => void
  const finished = new Promise<autocannon.Result>((resolve, reject) => {
    finish = resolve
    fail = reject
  })
  const instance = autocannon(
    {
      url: o.url,
      connections: o.connections,
      duration: o.durationS,
      requests: [
        {
          method: 'POST',
          headers: { 'content-type': 'application/json', ...o.headers },
          // One request in flight per connection: its context says which clientIds it carried.
          setupRequest: (req, context: { ids?: string[] }) => {
            const { path, body, ids } = o.next()
            context.ids = ids
            return { ...req, path, body }
          },
          onResponse: (status: number, _body: string, context: { ids?: string[] }) => {
            if (status >= 200 && status < 300 && context.ids) acknowledged.push(...context.ids)
          },
        },
      ],
    },
    (err, result) => (err ? fail(err) : finish(result)),
  )
  instance.on('response', (_client, statusCode, _bytes, ms) => {
    times.push(ms)
    if (statusCode < 200 || statusCode > 299) non2xx += 1
  })
  const result = await finished
  times.sort((a, b) => a - b)
  return {
    requests: times.length,
    non2xx,
    acknowledged,
    errors: result.errors + result.timeouts,
    rps: times.length / o.durationS,
    p50Ms: percentile(times, 0.5),
    p95Ms: percentile(times, 0.95),
    p99Ms: percentile(times, 0.99),
  }
}
