/**
 * The certificate e-mail (one outbox row per certificate contact) and, on withdrawal, the notice to
 * those it was sent to; both queued in the caller's transaction.
 */
import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { CertificateData, DeliveryKind } from '../../../shared/api/certificates'

function signOff(data: CertificateData): string {
  return (
    `Sent by Filmtrail for ${data.issuer.name}. Replies to this address are not read; for questions ` +
    'please contact the plant’s quality office.'
  )
}

export function certificateMailText(
  data: CertificateData,
  recipientName: string,
): { subject: string; text: string } {
  const subject = `Certificate of conformance ${data.number} — lot ${data.lotNumber}, order ${data.orderRef}`
  const lines = [
    `Hello ${recipientName},`,
    '',
    `Attached is certificate of conformance ${data.number} (EN 10204 type ${data.kind}) from ${data.issuer.name} ` +
      `for lot ${data.lotNumber}, your order ${data.orderRef}.`,
  ]
  if (data.supersedes)
    lines.push(`It replaces certificate ${data.supersedes}, which is no longer valid.`)
  lines.push(
    '',
    'Anyone holding the certificate can check that it is genuine and still valid here:',
    data.verifyUrl,
    'That page also shows the SHA-256 fingerprint of the PDF file; it matches the attachment.',
    '',
    signOff(data),
  )
  return { subject, text: lines.join('\n') }
}

interface OutboxRow {
  certificateId: number
  kind: DeliveryKind
  contactId: number | null
  name: string
  email: string
  subject: string
  text: string
}

async function insertOutboxRow(row: OutboxRow, t: Transaction) {
  await sequelize.query(
    `INSERT INTO mail_outbox
       (certificate_id, kind, contact_id, recipient_name, recipient_email, subject, body_text)
     VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    {
      bind: [
        row.certificateId,
        row.kind,
        row.contactId,
        row.name,
        row.email,
        row.subject,
        row.text,
      ],
      transaction: t,
    },
  )
}

interface Contact {
  id: number
  name: string
  email: string
}

export async function certificateContacts(customerId: number, t: Transaction): Promise<Contact[]> {
  return sequelize.query<Contact>(
    `SELECT id, name, email FROM customer_contacts
      WHERE customer_id = $1 AND receives_certificates AND active ORDER BY id`,
    { bind: [customerId], type: QueryTypes.SELECT, transaction: t },
  )
}

/** Queues the e-mail for each contact; answers how many were queued. */
export async function queueCertificateMail(
  certificateId: number,
  data: CertificateData,
  contacts: Contact[],
  t: Transaction,
): Promise<number> {
  for (const c of contacts) {
    const { subject, text } = certificateMailText(data, c.name)
    await insertOutboxRow(
      {
        certificateId,
        kind: 'certificate',
        contactId: c.id,
        name: c.name,
        email: c.email,
        subject,
        text,
      },
      t,
    )
  }
  return contacts.length
}

/** A withdrawn or replaced certificate is not sent any more: its waiting messages stop here. */
export async function cancelQueuedMail(certificateId: number, why: string, t: Transaction) {
  await sequelize.query(
    `UPDATE mail_outbox SET status = 'failed', last_error = $2, updated_at = now()
      WHERE certificate_id = $1 AND status = 'queued' AND kind = 'certificate'`,
    { bind: [certificateId, why], transaction: t },
  )
}

export function withdrawalMailText(
  data: CertificateData,
  recipientName: string,
  reason: string,
): { subject: string; text: string } {
  const subject = `Certificate of conformance ${data.number} withdrawn — lot ${data.lotNumber}, order ${data.orderRef}`
  const lines = [
    `Hello ${recipientName},`,
    '',
    `Certificate of conformance ${data.number} from ${data.issuer.name}, which we sent you for lot ` +
      `${data.lotNumber} (your order ${data.orderRef}), has been withdrawn and is no longer valid.`,
    '',
    `Reason: ${reason}`,
    '',
    'Please do not rely on it. Its check page now shows it as withdrawn:',
    data.verifyUrl,
    '',
    signOff(data),
  ]
  return { subject, text: lines.join('\n') }
}

/**
 * On withdrawal: a notice for each address the certificate went to (or was going out to at that
 * moment), once per address. Answers how many were queued.
 */
export async function queueWithdrawalNotices(
  certificateId: number,
  data: CertificateData,
  reason: string,
  t: Transaction,
): Promise<number> {
  const holders = await sequelize.query<{ contact_id: number | null; name: string; email: string }>(
    `SELECT DISTINCT ON (lower(recipient_email)) contact_id, recipient_name AS name,
            recipient_email AS email
       FROM mail_outbox
      WHERE certificate_id = $1 AND kind = 'certificate' AND status IN ('sent', 'sending')
      ORDER BY lower(recipient_email), id DESC`,
    { bind: [certificateId], type: QueryTypes.SELECT, transaction: t },
  )
  for (const h of holders) {
    const { subject, text } = withdrawalMailText(data, h.name, reason)
    await insertOutboxRow(
      {
        certificateId,
        kind: 'withdrawal',
        contactId: h.contact_id,
        name: h.name,
        email: h.email,
        subject,
        text,
      },
      t,
    )
  }
  return holders.length
}
