import rateLimit from 'express-rate-limit'
import { QueryTypes } from 'sequelize'
import { z } from 'zod'
import { sequelize } from '../../db'
import { env } from '../../config/env'
import { notFound } from '../../lib/httpError'
import { secureRouter } from '../secureRouter'
import type { CertificateState, VerifyResult } from '../../../shared/api/certificates'
import { verifyUrlFor } from '../certificates/certificateNumber'

/**
 * GET /api/verify/:code — public: anyone holding a certificate may check it. It answers validity,
 * number, issue date, lot number and fingerprints, and nothing more (no customer, no parts, no
 * results). Rate limited per address, so codes cannot be tried in bulk; they are random anyway.
 */
const r = secureRouter('/api/verify')

r.router.use(
  rateLimit({
    windowMs: 60_000,
    limit: 30,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) =>
      res.status(429).json({
        error: {
          code: 'rate_limited',
          message: 'Too many checks from here; wait a minute and try again',
        },
      }),
  }),
)

const codeParams = z.object({ code: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/) })

r.get(
  '/:code',
  { roles: 'public', params: codeParams },
  async ({ params, res }): Promise<VerifyResult> => {
    res.setHeader('Cache-Control', 'no-store')
    const [row] = await sequelize.query<{
      state: CertificateState
      number: string
      issued_at: Date
      lot_number: string
      pdf_sha256: string
      content_sha256: string
      revoked_at: Date | null
      successor_code: string | null
    }>(
      `SELECT c.state, c.number, c.issued_at, l.lot_number, c.pdf_sha256, c.content_sha256, c.revoked_at,
            s.verify_code AS successor_code
       FROM certificates c JOIN lots l ON l.id = c.lot_id
       LEFT JOIN certificates s ON s.id = c.superseded_by_id
      WHERE c.verify_code = $1`,
      { bind: [params.code], type: QueryTypes.SELECT },
    )
    if (!row) throw notFound('No certificate with this verification code')
    return {
      state: row.state,
      number: row.number,
      issuedAt: new Date(row.issued_at).toISOString(),
      lotNumber: row.lot_number,
      fingerprint: row.pdf_sha256,
      contentFingerprint: row.content_sha256,
      successor: row.successor_code
        ? {
            verifyCode: row.successor_code,
            verifyUrl: verifyUrlFor(env.PUBLIC_URL, row.successor_code),
          }
        : null,
      revokedAt: row.revoked_at ? new Date(row.revoked_at).toISOString() : null,
    }
  },
)

export const verifyRouter = r
