/**
 * Issue, reissue, revoke and resend. Every write locks the lot (issue) or the certificate
 * (the rest) first, renders the PDF once, stores it with its fingerprints, queues the e-mail and
 * writes the audit event — all in one transaction.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { inTransaction, sequelize } from '../../db'
import { Certificate, Lot } from '../../db/models'
import { env } from '../../config/env'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type { CertificateKind } from '../../../shared/api/certificates'
import {
  certificateFingerprint,
  contentFingerprint,
  renderCertificatePdf,
} from '../../pdf/certificatePdf'
import { getPlantSettings } from '../settings/settings.service'
import { specContentFor } from '../lots/specCache'
import { loadCertificateSource } from './certificateSource'
import { buildCertificateData } from './certificateData'
import { newVerifyCode, nextCertificateNumber, verifyUrlFor } from './certificateNumber'
import {
  cancelQueuedMail,
  certificateContacts,
  queueCertificateMail,
  queueWithdrawalNotices,
} from './certificateMail'

interface Predecessor {
  id: number
  number: string
  reason: string
}

/**
 * Builds, renders and stores one certificate for a locked, released lot; queues its e-mail.
 * `at` is the issue time (the demo seed dates its history; everyone else issues now).
 */
export async function createCertificate(
  actor: AuditActor,
  lot: Lot,
  kind: CertificateKind,
  t: Transaction,
  predecessor: Predecessor | null,
  at: Date = new Date(),
): Promise<Certificate> {
  const source = await loadCertificateSource(lot.id, t)
  if (!source) throw notFound(`Lot #${lot.id}`)
  const plant = await getPlantSettings(t)
  const spec = await specContentFor(lot.specId, lot.specVersion, t)
  // Whole seconds: the PDF's CreationDate holds no milliseconds, so the stored time matches it.
  const issuedAt = new Date(Math.floor(at.getTime() / 1000) * 1000)
  const number = await nextCertificateNumber(plant.plantName, issuedAt, t)
  const verifyCode = newVerifyCode()
  const data = buildCertificateData(source, spec, plant, {
    number,
    kind,
    issuedAt: issuedAt.toISOString(),
    verifyUrl: verifyUrlFor(env.PUBLIC_URL, verifyCode),
    supersedes: predecessor?.number ?? null,
  })
  const pdf = await renderCertificatePdf(data)
  const [{ id }] = (await sequelize.query<{ id: number }>(
    "SELECT nextval('certificates_id_seq')::int AS id",
    { type: QueryTypes.SELECT, transaction: t },
  )) as [{ id: number }]
  if (predecessor) {
    // The old one steps aside first (its foreign key to the new id is checked at commit).
    await sequelize.query(
      `UPDATE certificates SET state = 'superseded', superseded_by_id = $2, superseded_at = $3,
              updated_at = now() WHERE id = $1`,
      { bind: [predecessor.id, id, issuedAt], transaction: t },
    )
    await cancelQueuedMail(predecessor.id, `Not sent: replaced by ${number} before it went out`, t)
  }
  const cert = await Certificate.create(
    {
      id,
      number,
      kind,
      lotId: lot.id,
      customerId: source.lot.customer_id,
      verifyCode,
      data,
      pdf,
      pdfSha256: certificateFingerprint(pdf),
      contentSha256: contentFingerprint(data),
      issuedBy: actor.id,
      issuedAt,
      supersedesId: predecessor?.id ?? null,
      reissueReason: predecessor?.reason ?? null,
    },
    { transaction: t },
  )
  const queued = await queueCertificateMail(
    cert.id,
    data,
    await certificateContacts(source.lot.customer_id, t),
    t,
  )
  await recordAudit(t, actor, {
    action: predecessor ? 'certificate.reissue' : 'certificate.issue',
    entityType: 'certificate',
    entityId: cert.id,
    lotId: lot.id,
    before: predecessor
      ? { certificateId: predecessor.id, number: predecessor.number, state: 'valid' }
      : null,
    after: {
      number,
      kind,
      pdfSha256: cert.pdfSha256,
      contentSha256: cert.contentSha256,
      emailsQueued: queued,
      ...(predecessor ? { supersedes: predecessor.number, reason: predecessor.reason } : {}),
    },
    note: predecessor
      ? `Certificate ${number} issued for lot ${lot.lotNumber}, replacing ${predecessor.number}: ${predecessor.reason}`
      : `Certificate ${number} (EN 10204 type ${kind}) issued for lot ${lot.lotNumber}`,
  })
  return cert
}

async function lockReleasedLot(lotId: number, t: Transaction): Promise<Lot> {
  const lot = await Lot.findByPk(lotId, { lock: t.LOCK.UPDATE, transaction: t })
  if (!lot) throw notFound(`Lot #${lotId}`)
  if (lot.status !== 'released') {
    throw conflict(
      'lot_not_released',
      `Lot ${lot.lotNumber} is ${lot.status}: a certificate is issued only for a released lot`,
    )
  }
  return lot
}

async function lockCertificate(id: number, t: Transaction): Promise<Certificate> {
  const cert = await Certificate.findByPk(id, {
    lock: t.LOCK.UPDATE,
    transaction: t,
    attributes: { exclude: ['pdf'] },
  })
  if (!cert) throw notFound(`Certificate #${id}`)
  return cert
}

function requireValid(cert: Certificate, doing: string) {
  if (cert.state !== 'valid') {
    throw conflict(
      'certificate_not_valid',
      `Certificate ${cert.number} is ${cert.state}: only a valid certificate can be ${doing}`,
    )
  }
}

/** POST /api/lots/:id/certificates */
export async function issueCertificate(actor: AuditActor, lotId: number, kind: CertificateKind) {
  return inTransaction(async (t) => {
    const lot = await lockReleasedLot(lotId, t)
    const valid = await Certificate.findOne({
      where: { lotId, state: 'valid' },
      attributes: ['id', 'number'],
      transaction: t,
    })
    if (valid) {
      throw conflict(
        'already_certified',
        `Lot ${lot.lotNumber} already has the valid certificate ${valid.number}: reissue that one instead`,
        { certificateId: valid.id },
      )
    }
    return (await createCertificate(actor, lot, kind, t, null)).id
  })
}

/** POST /api/certificates/:id/reissue: a new certificate from the lot as it is now. */
export async function reissueCertificate(
  actor: AuditActor,
  id: number,
  body: { reason: string; kind?: CertificateKind },
) {
  return inTransaction(async (t) => {
    const old = await lockCertificate(id, t)
    requireValid(old, 'reissued')
    const lot = await lockReleasedLot(old.lotId, t)
    const predecessor = { id: old.id, number: old.number, reason: body.reason }
    return (await createCertificate(actor, lot, body.kind ?? old.kind, t, predecessor)).id
  })
}

/** POST /api/certificates/:id/revoke */
export async function revokeCertificate(actor: AuditActor, id: number, reason: string) {
  return inTransaction(async (t) => {
    const cert = await lockCertificate(id, t)
    requireValid(cert, 'withdrawn')
    await cert.update(
      { state: 'revoked', revokedAt: new Date(), revokedBy: actor.id, revokeReason: reason },
      { transaction: t },
    )
    await cancelQueuedMail(cert.id, 'Not sent: the certificate was withdrawn before it went out', t)
    const noticesQueued = await queueWithdrawalNotices(cert.id, cert.data, reason, t)
    await recordAudit(t, actor, {
      action: 'certificate.revoke',
      entityType: 'certificate',
      entityId: cert.id,
      lotId: cert.lotId,
      before: { state: 'valid' },
      after: { state: 'revoked', reason, noticesQueued },
      note: `Certificate ${cert.number} withdrawn: ${reason}`,
    })
    return cert.id
  })
}

/**
 * POST /api/certificates/:id/resend: a failed or waiting message is queued again from scratch;
 * a sent one gets a new message (the first stays on record); contacts added since are included.
 */
export async function resendCertificate(actor: AuditActor, id: number, deliveryId?: number) {
  return inTransaction(async (t) => {
    const cert = await lockCertificate(id, t)
    requireValid(cert, 'sent')
    const rows = await sequelize.query<{
      id: string
      status: string
      contact_id: number | null
      recipient_email: string
    }>(
      `SELECT DISTINCT ON (lower(recipient_email)) id, status, contact_id, recipient_email
         FROM mail_outbox WHERE certificate_id = $1 AND kind = 'certificate'
        ORDER BY lower(recipient_email), id DESC`,
      { bind: [cert.id], type: QueryTypes.SELECT, transaction: t },
    )
    const chosen = deliveryId === undefined ? rows : rows.filter((r) => Number(r.id) === deliveryId)
    if (deliveryId !== undefined && chosen.length === 0) throw notFound(`Delivery #${deliveryId}`)
    let queued = 0
    for (const r of chosen) {
      if (r.status === 'sending') continue
      if (r.status === 'sent') {
        await sequelize.query(
          `INSERT INTO mail_outbox (certificate_id, contact_id, recipient_name, recipient_email, subject, body_text)
           SELECT certificate_id, contact_id, recipient_name, recipient_email, subject, body_text
             FROM mail_outbox WHERE id = $1`,
          { bind: [r.id], transaction: t },
        )
      } else {
        await sequelize.query(
          `UPDATE mail_outbox SET status = 'queued', attempts = 0, next_attempt_at = now(),
                  last_error = NULL, updated_at = now() WHERE id = $1`,
          { bind: [r.id], transaction: t },
        )
      }
      queued += 1
    }
    if (deliveryId === undefined) {
      const known = new Set(rows.map((r) => r.recipient_email.toLowerCase()))
      const fresh = (await certificateContacts(cert.customerId, t)).filter(
        (c) => !known.has(c.email.toLowerCase()),
      )
      queued += await queueCertificateMail(cert.id, cert.data, fresh, t)
    }
    await recordAudit(t, actor, {
      action: 'certificate.resend',
      entityType: 'certificate',
      entityId: cert.id,
      lotId: cert.lotId,
      after: { emailsQueued: queued, deliveryId: deliveryId ?? null },
      note: `Certificate ${cert.number}: e-mail queued again for ${queued} recipient(s)`,
    })
    return cert.id
  })
}
