/**
 * The one HTTP client. Every request goes through `request`: it attaches the bearer token, turns
 * the server's `{ error: { code, message, details } }` into an ApiError, and tells the session
 * when a signed-in request comes back 401.
 */
import type { ApiErrorBody } from '@shared/api/errors'

export interface FieldIssue {
  /** The path without the "body." / "query." prefix, e.g. "content.thickness.maxUm". */
  field: string
  message: string
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message)
    this.name = 'ApiError'
  }

  /** The per-field messages of a 400 invalid_input answer (secureRouter's `details`). */
  get fieldIssues(): FieldIssue[] {
    if (!Array.isArray(this.details)) return []
    return this.details
      .filter((d): d is { field: string; message: string } => typeof d?.field === 'string' && typeof d?.message === 'string')
      .map((d) => ({ field: d.field.replace(/^(body|query|params)\./, ''), message: d.message }))
  }
}

export function toApiError(err: unknown): ApiError {
  if (err instanceof ApiError) return err
  return new ApiError(0, 'client_error', err instanceof Error ? err.message : String(err))
}

interface ApiHooks {
  getToken: () => string | null
  onSessionEnded: () => void
}
let hooks: ApiHooks = { getToken: () => null, onSessionEnded: () => {} }

/** Called once from main.ts (and from component tests) so this module needs no store or router. */
export function configureApi(next: ApiHooks) {
  hooks = next
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'

async function request<T>(method: Method, path: string, body?: unknown): Promise<T> {
  const token = hooks.getToken()
  const headers: Record<string, string> = { Accept: 'application/json' }
  if (body !== undefined) headers['Content-Type'] = 'application/json'
  if (token) headers.Authorization = `Bearer ${token}`
  let res: Response
  try {
    res = await fetch(path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) })
  } catch {
    throw new ApiError(0, 'network', 'Cannot reach the Filmtrail server. Check the connection and try again.')
  }
  const text = await res.text()
  let data: unknown = null
  if (text) {
    try {
      data = JSON.parse(text)
    } catch {
      data = null
    }
  }
  if (!res.ok) {
    const error = (data as Partial<ApiErrorBody> | null)?.error
    if (res.status === 401 && token) hooks.onSessionEnded()
    throw new ApiError(
      res.status,
      error?.code ?? 'http_error',
      error?.message ?? `The server answered ${res.status} ${res.statusText}`.trim(),
      error?.details,
    )
  }
  return data as T
}

/**
 * A file download (CSV, PDF) with the same bearer token and error handling as `request`: the
 * caller turns the Blob into a download link. The file name comes from Content-Disposition.
 */
async function requestBlob(path: string): Promise<{ blob: Blob; fileName: string | null }> {
  const token = hooks.getToken()
  const headers: Record<string, string> = {}
  if (token) headers.Authorization = `Bearer ${token}`
  let res: Response
  try {
    res = await fetch(path, { headers })
  } catch {
    throw new ApiError(0, 'network', 'Cannot reach the Filmtrail server. Check the connection and try again.')
  }
  if (!res.ok) {
    let error: ApiErrorBody['error'] | undefined
    try {
      error = ((await res.json()) as Partial<ApiErrorBody>).error
    } catch {
      error = undefined
    }
    if (res.status === 401 && token) hooks.onSessionEnded()
    throw new ApiError(res.status, error?.code ?? 'http_error', error?.message ?? `The server answered ${res.status}`, error?.details)
  }
  const disposition = res.headers.get('Content-Disposition') ?? ''
  const fileName = /filename="([^"]+)"/.exec(disposition)?.[1] ?? null
  return { blob: await res.blob(), fileName }
}

export const api = {
  getBlob: requestBlob,
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
}
