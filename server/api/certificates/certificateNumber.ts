import { randomBytes } from 'node:crypto'
import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'

/**
 * "HFW-C-26-00042": the plant's initials, C for certificate, the two-digit year, the year's
 * sequence. The initials come from the plant name up to any dash ("Harrowgate Flow Works —
 * Coating Shop" → HFW), so a renamed plant starts its own series and numbers never collide.
 */
export function certificatePrefix(plantName: string, at: Date): string {
  const name = plantName.split(/\s[—–-]\s/)[0] ?? plantName
  const initials = name
    .split(/\s+/)
    .map((w) =>
      w
        .replace(/[^A-Za-z]/g, '')
        .charAt(0)
        .toUpperCase(),
    )
    .join('')
    .slice(0, 4)
  return `${initials || 'FT'}-C-${String(at.getUTCFullYear() % 100).padStart(2, '0')}`
}

/** Next number under the counter row's lock (held to the end of the caller's transaction). */
export async function nextCertificateNumber(
  plantName: string,
  at: Date,
  t: Transaction,
): Promise<string> {
  const prefix = certificatePrefix(plantName, at)
  const [row] = await sequelize.query<{ last_seq: number }>(
    `INSERT INTO certificate_number_counters (prefix, last_seq) VALUES ($1, 1)
     ON CONFLICT (prefix) DO UPDATE SET last_seq = certificate_number_counters.last_seq + 1
     RETURNING last_seq`,
    { bind: [prefix], type: QueryTypes.SELECT, transaction: t },
  )
  return `${prefix}-${String(row!.last_seq).padStart(5, '0')}`
}

/** 16 random bytes, base64url (22 characters): not derived from the id, not guessable. */
export function newVerifyCode(): string {
  return randomBytes(16).toString('base64url')
}

export function verifyUrlFor(publicUrl: string, code: string): string {
  return `${publicUrl.replace(/\/+$/, '')}/verify/${code}`
}
