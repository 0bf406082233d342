/**
 * The shop-floor endpoints (shared/api/lots.ts), typed once. Reads go through the one client in
 * services/api.ts. Writes are described as `FloorWrite`s and sent by the offline queue
 * (stores/offlineQueue.ts) through `sendWrite`, which adds what the JSON client cannot do: a
 * time limit (a server that does not answer is treated like a dropped network) and multipart
 * photo uploads. Image bytes need the bearer token too, so thumbnails are fetched as blobs here.
 */
import type { z } from 'zod'
import { api, ApiError } from './api'
import { useSessionStore } from '@/stores/session'
import type {
  createLotSchema,
  discardReadingSchema,
  LotDetail,
  LotRow,
  lotListQuerySchema,
  partBodySchema,
  PartDetail,
  PhotoRow,
  readingSchema,
  SectionName,
  verificationSchema,
} from '@shared/api/lots'
import type { ApiErrorBody } from '@shared/api/errors'

export type LotListQuery = Partial<z.input<typeof lotListQuerySchema>>
export type CreateLotBody = z.input<typeof createLotSchema>
export type PartBody = z.input<typeof partBodySchema>
export type ReadingBody = z.input<typeof readingSchema>
export type VerificationBody = z.input<typeof verificationSchema>

function queryString(q: Record<string, unknown>): string {
  const p = new URLSearchParams()
  for (const [k, v] of Object.entries(q))
    if (v !== undefined && v !== null && v !== '') p.set(k, String(v))
  const s = p.toString()
  return s ? `?${s}` : ''
}

export const floorApi = {
  /** Newest first; the total is in X-Total-Count (the tablet shows the first page and says so). */
  lots: (q: LotListQuery) => api.get<LotRow[]>(`/api/lots${queryString(q)}`),
  lot: (id: number) => api.get<LotDetail>(`/api/lots/${id}`),
  part: (id: number) => api.get<PartDetail>(`/api/parts/${id}`),
}

/**
 * One write, as kept on the tablet until the server has it. Plain data (IndexedDB stores it by
 * structured clone), so a photo keeps its Blob and the multipart body is built at send time.
 */
export type FloorWrite =
  | { kind: 'open-lot'; body: CreateLotBody }
  | { kind: 'add-part'; lotId: number; body: PartBody }
  | {
      kind: 'section'
      partId: number
      section: SectionName
      body: { clientId: string; instrumentId: number | null; data: unknown }
    }
  | { kind: 'readings'; partId: number; body: { readings: ReadingBody[] } }
  | {
      kind: 'discard-reading'
      partId: number
      readingId: string
      body: z.input<typeof discardReadingSchema>
    }
  | { kind: 'verification'; partId: number | null; instrumentId: number; body: VerificationBody }
  | {
      kind: 'photo'
      partId: number | null
      lotId: number
      clientId: string
      caption: string
      file: Blob
      fileName: string
    }

function target(w: FloorWrite): { method: 'POST' | 'PUT'; path: string } {
  switch (w.kind) {
    case 'open-lot':
      return { method: 'POST', path: '/api/lots' }
    case 'add-part':
      return { method: 'POST', path: `/api/lots/${w.lotId}/parts` }
    case 'section':
      return { method: 'PUT', path: `/api/parts/${w.partId}/sections/${w.section}` }
    case 'readings':
      return { method: 'POST', path: `/api/parts/${w.partId}/readings` }
    case 'discard-reading':
      return { method: 'POST', path: `/api/readings/${encodeURIComponent(w.readingId)}/discard` }
    case 'verification':
      return { method: 'POST', path: `/api/instruments/${w.instrumentId}/verifications` }
    case 'photo':
      return w.partId === null
        ? { method: 'POST', path: `/api/lots/${w.lotId}/photos` }
        : { method: 'POST', path: `/api/parts/${w.partId}/photos` }
  }
}

/** Long enough for a photo over weak Wi-Fi, short enough that a hung request does not stall the queue. */
export const SEND_TIMEOUT_MS = 20_000

async function authorisedFetch(
  method: string,
  path: string,
  body: BodyInit | undefined,
  json: boolean,
  timeoutMs: number,
) {
  const token = useSessionStore().token
  const headers: Record<string, string> = { Accept: 'application/json' }
  if (json) headers['Content-Type'] = 'application/json'
  if (token) headers.Authorization = `Bearer ${token}`
  const controller = new AbortController()
  const timer = setTimeout(() => controller.abort(), timeoutMs)
  try {
    return await fetch(path, { method, headers, body, signal: controller.signal })
  } catch {
    throw new ApiError(
      0,
      'network',
      'The server did not answer. The record is kept on this tablet.',
    )
  } finally {
    clearTimeout(timer)
  }
}

async function errorFrom(res: Response): Promise<ApiError> {
  let body: Partial<ApiErrorBody> | null = null
  try {
    body = (await res.json()) as Partial<ApiErrorBody>
  } catch {
    body = null
  }
  const e = body?.error
  return new ApiError(
    res.status,
    e?.code ?? 'http_error',
    e?.message ?? `The server answered ${res.status}`,
    e?.details,
  )
}

/** Sends one write; resolves with the server's JSON answer, rejects with an ApiError (status 0: no answer). */
export async function sendWrite(w: FloorWrite, timeoutMs = SEND_TIMEOUT_MS): Promise<unknown> {
  const { method, path } = target(w)
  let body: BodyInit
  let json = true
  if (w.kind === 'photo') {
    const form = new FormData()
    form.append('clientId', w.clientId)
    form.append('caption', w.caption)
    form.append('file', w.file, w.fileName)
    body = form
    json = false
  } else {
    body = JSON.stringify(w.body)
  }
  const res = await authorisedFetch(method, path, body, json, timeoutMs)
  if (!res.ok) throw await errorFrom(res)
  const text = await res.text()
  return text ? (JSON.parse(text) as unknown) : null
}

/** The clientId a write is stored under on the server (and kept under on the tablet). */
export function writeClientId(w: FloorWrite): string | null {
  if (w.kind === 'photo') return w.clientId
  if (w.kind === 'readings')
    return w.body.readings.length === 1 ? w.body.readings[0]!.clientId : null
  if (w.kind === 'discard-reading') return null
  return w.body.clientId
}

/** Image bytes with the bearer token (an <img src> cannot send it). */
export async function fetchPhotoBlob(
  photoId: number,
  size: 'thumb' | 'full' = 'thumb',
): Promise<Blob> {
  const path = size === 'thumb' ? `/api/photos/${photoId}/thumb` : `/api/photos/${photoId}`
  const res = await authorisedFetch('GET', path, undefined, false, SEND_TIMEOUT_MS)
  if (!res.ok) throw await errorFrom(res)
  return res.blob()
}

export type { PhotoRow }
