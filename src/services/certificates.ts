/** Certificates of conformance and their public verification (shared/api/certificates.ts). */
import type {
  CertificateDetail,
  CertificateKind,
  CertificateRow,
  LotToCertify,
  VerifyResult,
} from '@shared/api/certificates'
import { api } from './api'

function query(params: Record<string, string | number | boolean | undefined>): string {
  const q = new URLSearchParams()
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== '') q.set(k, String(v))
  const s = q.toString()
  return s ? `?${s}` : ''
}

/** Hands a fetched file to the browser as a download. */
function saveBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = fileName
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 10_000)
}

export const certificatesApi = {
  list: (p: { q?: string; state?: string; needsReissue?: boolean; limit?: number } = {}) =>
    api.get<CertificateRow[]>(`/api/certificates${query(p)}`),
  lotsToIssue: (q?: string) =>
    api.get<LotToCertify[]>(`/api/certificates/lots-to-issue${query({ q })}`),
  detail: (id: number) => api.get<CertificateDetail>(`/api/certificates/${id}`),
  issue: (lotId: number, kind: CertificateKind) =>
    api.post<CertificateDetail>(`/api/lots/${lotId}/certificates`, { kind }),
  reissue: (id: number, reason: string, kind?: CertificateKind) =>
    api.post<CertificateDetail>(`/api/certificates/${id}/reissue`, { reason, kind }),
  revoke: (id: number, reason: string) =>
    api.post<CertificateDetail>(`/api/certificates/${id}/revoke`, { reason }),
  resend: (id: number, deliveryId?: number) =>
    api.post<CertificateDetail>(`/api/certificates/${id}/resend`, deliveryId ? { deliveryId } : {}),
  verify: (code: string) => api.get<VerifyResult>(`/api/verify/${encodeURIComponent(code)}`),
  async downloadPdf(id: number, number: string): Promise<void> {
    const { blob, fileName } = await api.getBlob(`/api/certificates/${id}/pdf`)
    saveBlob(blob, fileName ?? `certificate-${number}.pdf`)
  },
}
