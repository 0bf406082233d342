/**
 * Two fingerprints, because a file cannot contain its own hash:
 *
 * - certificateFingerprint(pdf): SHA-256 of the PDF FILE bytes. The server stores it beside the
 *   PDF and shows it on the public verification page, so a holder can check that the file in
 *   hand is byte-for-byte the one issued (e.g. `sha256sum certificate.pdf`).
 * - contentFingerprint(data): SHA-256 of the certificate DATA as canonical JSON (object keys
 *   sorted at every level, array order kept, no whitespace). It is printed in the PDF's footer as
 *   "Content fingerprint (SHA-256)", and the server can recompute it from the stored data.
 *
 * The PDF is deterministic for the same data (CreationDate = issuedAt, file ID derived from the
 * info dictionary), so re-rendering stored data reproduces the same certificateFingerprint too.
 */
import { createHash } from 'node:crypto'
import type { CertificateData } from '../../shared/api/certificates'

export function certificateFingerprint(pdf: Buffer): string {
  return createHash('sha256').update(pdf).digest('hex')
}

export function contentFingerprint(data: CertificateData): string {
  return createHash('sha256').update(canonicalJson(data), 'utf8').digest('hex')
}

/** JSON with sorted keys; undefined members are dropped exactly as JSON.stringify drops them. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value))
}

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys)
  if (value === null || typeof value !== 'object') return value
  const sorted: Record<string, unknown> = {}
  for (const key of Object.keys(value).sort()) {
    sorted[key] = sortKeys((value as Record<string, unknown>)[key])
  }
  return sorted
}
