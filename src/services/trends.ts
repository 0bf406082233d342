/** Line health endpoints (shared/api/trends.ts). */
import type { TrendsFilterInput, TrendsOptions, TrendsReport } from '@shared/api/trends'
import { api } from './api'

/** Only the filters that are set, as a query string (the same one the page keeps in its URL). */
export function trendsQueryString(filter: TrendsFilterInput): string {
  const params = new URLSearchParams()
  for (const [key, value] of Object.entries(filter)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value))
  }
  const s = params.toString()
  return s ? `?${s}` : ''
}

export const trendsApi = {
  report: (filter: TrendsFilterInput) =>
    api.get<TrendsReport>(`/api/trends${trendsQueryString(filter)}`),
  options: (period: { from?: string; to?: string }) =>
    api.get<TrendsOptions>(`/api/trends/options${trendsQueryString(period)}`),
  /** Fetches the CSV with the bearer token and hands it to the browser as a download. */
  async downloadCsv(filter: TrendsFilterInput): Promise<void> {
    const { blob, fileName } = await api.getBlob(
      `/api/trends/export.csv${trendsQueryString(filter)}`,
    )
    const url = URL.createObjectURL(blob)
    const a = document.createElement('a')
    a.href = url
    a.download = fileName ?? 'line-health.csv'
    document.body.appendChild(a)
    a.click()
    a.remove()
    // Give the browser a moment to start the download before the URL goes away.
    setTimeout(() => URL.revokeObjectURL(url), 10_000)
  },
}
