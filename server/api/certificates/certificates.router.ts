import { z } from 'zod'
import { idParams, secureRouter } from '../secureRouter'
import { QA } from '../../../shared/api/roles'
import {
  CERTIFICATE_READERS,
  CERTIFICATE_STAFF,
  certificateListQuerySchema,
  issueCertificateSchema,
  reasonSchema,
  reissueSchema,
  resendSchema,
} from '../../../shared/api/certificates'
import {
  issueCertificate,
  reissueCertificate,
  resendCertificate,
  revokeCertificate,
} from './certificates.service'
import { getCertificateDetail, getCertificatePdf, listCertificates } from './certificates.query'
import { lotsToCertify } from './lotsToCertify'

/** POST /api/lots/:id/certificates lives beside the lot's other review routes. */
const lots = secureRouter('/api/lots')
lots.post(
  '/:id/certificates',
  { roles: QA, params: idParams, body: issueCertificateSchema },
  async ({ user, params, body, res }) => {
    const id = await issueCertificate(user, params.id, body.kind)
    res.status(201)
    return getCertificateDetail(user, id)
  },
)
export const lotCertificatesRouter = lots

const r = secureRouter('/api/certificates')

r.get(
  '/',
  {
    roles: CERTIFICATE_READERS,
    query: certificateListQuerySchema.extend({
      needsReissue: z
        .enum(['true', 'false'])
        .optional()
        .transform((v) => v === 'true'),
    }),
  },
  async ({ user, query, res }) => {
    const { rows, total } = await listCertificates(user, query)
    res.setHeader('X-Total-Count', String(total))
    return rows
  },
)

r.get(
  '/lots-to-issue',
  {
    roles: CERTIFICATE_STAFF,
    query: z.object({
      q: z.string().trim().max(100).optional(),
      limit: z.coerce.number().int().min(1).max(200).default(50),
    }),
  },
  ({ query }) => lotsToCertify(query.q || undefined, query.limit),
)

r.get('/:id', { roles: CERTIFICATE_READERS, params: idParams }, ({ user, params }) =>
  getCertificateDetail(user, params.id),
)

r.get(
  '/:id/pdf',
  { roles: CERTIFICATE_READERS, params: idParams },
  async ({ user, params, res }) => {
    const { number, pdf, sha256 } = await getCertificatePdf(user, params.id)
    res.setHeader('Content-Type', 'application/pdf')
    res.setHeader('Content-Disposition', `attachment; filename="certificate-${number}.pdf"`)
    res.setHeader('X-Content-SHA256', sha256)
    res.setHeader('Cache-Control', 'private, no-store')
    res.end(pdf)
  },
)

r.post(
  '/:id/reissue',
  { roles: QA, params: idParams, body: reissueSchema },
  async ({ user, params, body, res }) => {
    const id = await reissueCertificate(user, params.id, body)
    res.status(201)
    return getCertificateDetail(user, id)
  },
)

r.post(
  '/:id/revoke',
  { roles: QA, params: idParams, body: reasonSchema },
  async ({ user, params, body }) =>
    getCertificateDetail(user, await revokeCertificate(user, params.id, body.reason)),
)

r.post(
  '/:id/resend',
  { roles: QA, params: idParams, body: resendSchema },
  async ({ user, params, body }) =>
    getCertificateDetail(user, await resendCertificate(user, params.id, body.deliveryId)),
)

export const certificatesRouter = r
