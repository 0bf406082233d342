/**
 * The QA review endpoints (shared/api/review.ts), typed once. JSON goes through the one client in
 * services/api.ts; two things it cannot do are done here with the same token and error shape: a
 * multipart photo upload, and reading the audit search's X-Total-Count header.
 */
import type { z } from 'zod'
import { api, ApiError } from './api'
import { useSessionStore } from '@/stores/session'
import type { ApiErrorBody } from '@shared/api/errors'
import type { LotDetail, LotRow, PhotoRow } from '@shared/api/lots'
import type {
  AuditEventRow,
  closeNcSchema,
  createNcSchema,
  Decision,
  DecisionRow,
  defectTypeSchema,
  dispositionSchema,
  NcStatus,
  NonconformanceRow,
  QueueRow,
} from '@shared/api/review'
import type { CriterionName } from '@shared/rules/verdict'

type In<S extends z.ZodType> = z.input<S>

/** A queue row as the server answers it: the contract's row plus the lot verdict. */
export type QueueEntry = QueueRow & { lotVerdict: LotDetail['lotVerdict'] }
/** An audit event with the actor's name (the server joins it in). */
export type AuditEntry = AuditEventRow & { actorName: string | null }
export type NcDetail = NonconformanceRow & { photos: PhotoRow[] }
export interface DefectTypeRow {
  id: number
  code: string
  label: string
  active: boolean
}

/** One item that stands in the way of a release (the details of a 409 release_blocked). */
export type ReleaseBlocker =
  | {
      kind: 'part'
      partId: number
      partNumber: string
      round: number
      criterion: CriterionName | null
      status: 'fail' | 'incomplete'
      reason: string
    }
  | { kind: 'nonconformance'; nonconformanceId: number; number: string; status: NcStatus }
  | { kind: 'lot'; reason: string }

export interface AuditSearch {
  actorId?: number
  entityType?: string
  entityId?: string
  lotNumber?: string
  from?: string
  to?: string
  limit?: number
  offset?: number
}

function queryString(q: object): string {
  const p = new URLSearchParams()
  for (const [k, v] of Object.entries(q)) {
    if (v !== undefined && v !== null && v !== '') p.set(k, String(v))
  }
  const s = p.toString()
  return s ? `?${s}` : ''
}

/** A raw fetch with the bearer token, failing with the same ApiError the JSON client throws. */
async function authorisedFetch(path: string, init: RequestInit = {}): Promise<Response> {
  const session = useSessionStore()
  const headers = new Headers(init.headers)
  headers.set('Accept', 'application/json')
  if (session.token) headers.set('Authorization', `Bearer ${session.token}`)
  let res: Response
  try {
    res = await fetch(path, { ...init, headers })
  } catch {
    throw new ApiError(
      0,
      'network',
      'Cannot reach the Filmtrail server. Check the connection and try again.',
    )
  }
  if (res.ok) return res
  let error: ApiErrorBody['error'] | undefined
  try {
    error = ((await res.json()) as Partial<ApiErrorBody>).error
  } catch {
    error = undefined
  }
  throw new ApiError(
    res.status,
    error?.code ?? 'http_error',
    error?.message ?? `The server answered ${res.status}`,
    error?.details,
  )
}

export const reviewApi = {
  queue: () => api.get<QueueEntry[]>('/api/review/queue'),
  submit: (lotId: number, version?: number) =>
    api.post<{ lot: LotRow; nonconformancesOpened: NonconformanceRow[] }>(
      `/api/lots/${lotId}/submit`,
      version === undefined ? {} : { version },
    ),
  decide: (lotId: number, body: { decision: Decision; reason: string; version: number }) =>
    api.post<{ lot: LotRow; decision: DecisionRow }>(`/api/lots/${lotId}/decisions`, body),
  decisions: (lotId: number) => api.get<DecisionRow[]>(`/api/lots/${lotId}/decisions`),
  reopen: (lotId: number, body: { reason: string; version: number }) =>
    api.post<{ lot: LotRow; certificatesMarked: number }>(`/api/lots/${lotId}/reopen`, body),
  history: (lotId: number) => api.get<AuditEntry[]>(`/api/lots/${lotId}/history`),
}

export const ncApi = {
  list: (q: { status?: NcStatus; lotId?: number } = {}) =>
    api.get<NonconformanceRow[]>(`/api/nonconformances${queryString(q)}`),
  get: (id: number) => api.get<NcDetail>(`/api/nonconformances/${id}`),
  create: (body: In<typeof createNcSchema>) =>
    api.post<NonconformanceRow>('/api/nonconformances', body),
  disposition: (id: number, body: In<typeof dispositionSchema>) =>
    api.post<NonconformanceRow>(`/api/nonconformances/${id}/disposition`, body),
  close: (id: number, body: In<typeof closeNcSchema>) =>
    api.post<NonconformanceRow>(`/api/nonconformances/${id}/close`, body),
  async uploadPhoto(id: number, file: File, caption: string): Promise<PhotoRow> {
    const form = new FormData()
    form.append('clientId', crypto.randomUUID())
    form.append('caption', caption)
    form.append('file', file, file.name || 'photo.jpg')
    const res = await authorisedFetch(`/api/nonconformances/${id}/photos`, {
      method: 'POST',
      body: form,
    })
    return (await res.json()) as PhotoRow
  },
}

export const defectTypesApi = {
  list: () => api.get<DefectTypeRow[]>('/api/defect-types'),
  create: (body: In<typeof defectTypeSchema>) => api.post<DefectTypeRow>('/api/defect-types', body),
  update: (id: number, body: Partial<In<typeof defectTypeSchema>>) =>
    api.patch<DefectTypeRow>(`/api/defect-types/${id}`, body),
}

export const auditApi = {
  /** Newest first; `total` is every match, for the pager. */
  async search(q: AuditSearch): Promise<{ rows: AuditEntry[]; total: number }> {
    const res = await authorisedFetch(`/api/audit${queryString(q)}`)
    const rows = (await res.json()) as AuditEntry[]
    return { rows, total: Number(res.headers.get('X-Total-Count') ?? rows.length) }
  },
}

/** Photo bytes through the API client with the token (an <img src> cannot send it). */
export async function photoBlob(photoId: number, size: 'thumb' | 'full' = 'thumb'): Promise<Blob> {
  const { blob } = await api.getBlob(
    size === 'thumb' ? `/api/photos/${photoId}/thumb` : `/api/photos/${photoId}`,
  )
  return blob
}
