/**
 * The certificate e-mail through the outbox: queued in the issuing transaction, sent by the
 * worker to an in-process SMTP fake, retried while the SMTP server is down, never sent twice by
 * two workers on one database, and queued again by a resend.
 */
import { describe, expect, it, beforeAll, afterEach } from 'vitest'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { OutboxWorker } from '../../../server/mail/outboxWorker'
import { createSmtpSender } from '../../../server/mail/transport'
import { retryDelayMs } from '../../../server/mail/backoff'
import { reviewWorld, type ReviewWorld } from '../review/reviewSupport'
import {
  freePort,
  issue,
  releasedLot,
  startSmtpFake,
  withContacts,
  type SmtpFake,
} from './certSupport'
import type { CertificateDetail } from '../../../shared/api/certificates'

const app = createApp()
const FAST_RETRY = { baseDelayMs: 50, maxDelayMs: 200, maxAttempts: 3 }
const cleanups: (() => Promise<void> | void)[] = []
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c()
})

function workerOn(port: number, id: string) {
  const sender = createSmtpSender({ host: '127.0.0.1', port, timeoutMs: 2000 })
  const worker = new OutboxWorker({
    sender,
    from: 'Filmtrail certificates <certificates@harrowgate.example>',
    pollMs: 50,
    retry: FAST_RETRY,
    workerId: id,
  })
  cleanups.push(async () => {
    await worker.stop()
    sender.close()
  })
  return worker
}

async function outboxOf(certificateId: number) {
  return sequelize.query<{
    recipient_email: string
    status: string
    attempts: number
    last_error: string | null
  }>(
    'SELECT recipient_email, status, attempts, last_error FROM mail_outbox WHERE certificate_id = $1 ORDER BY id',
    { bind: [certificateId], type: QueryTypes.SELECT },
  )
}

async function until(check: () => Promise<boolean> | boolean, timeoutMs = 8000) {
  const end = Date.now() + timeoutMs
  while (Date.now() < end) {
    if (await check()) return
    await new Promise((r) => setTimeout(r, 50))
  }
  throw new Error('timed out waiting')
}

describe('certificate e-mail outbox', () => {
  let w: ReviewWorld
  let receiving: string[]
  let fake: SmtpFake

  beforeAll(async () => {
    w = await reviewWorld(app)
    receiving = (await withContacts(w.customerId)).receiving
  })

  async function issued(): Promise<CertificateDetail> {
    const lot = await releasedLot(app, w)
    const res = await issue(app, w.supervisor.auth, lot.id)
    expect(res.status).toBe(201)
    return res.body as CertificateDetail
  }

  it('queues one message per certificate contact in the issuing transaction, and sends it with the PDF', async () => {
    const cert = await issued()
    // Queued before any worker ran: the issue itself wrote the rows.
    expect(cert.deliveries!.map((d) => [d.recipientEmail, d.state])).toEqual(
      receiving.map((e) => [e, 'queued']),
    )
    fake = await startSmtpFake()
    cleanups.push(() => fake.stop())
    await workerOn(fake.port, 'w-send').runOnce()
    expect(fake.envelopes.flat().sort()).toEqual([...receiving].sort())
    for (const mail of fake.messages) {
      expect(mail.subject).toContain(cert.number)
      expect(mail.text).toContain(cert.verifyUrl)
      expect(mail.attachments).toHaveLength(1)
      const pdf = mail.attachments[0]!
      expect(pdf.contentType).toBe('application/pdf')
      expect(pdf.filename).toBe(`certificate-${cert.number}.pdf`)
      // The attachment is the stored file, byte for byte.
      const { createHash } = await import('node:crypto')
      expect(createHash('sha256').update(pdf.content).digest('hex')).toBe(cert.fingerprint)
    }
    const after = await request(app)
      .get(`/api/certificates/${cert.id}`)
      .set('Authorization', w.supervisor.auth)
    expect(after.body.deliveries.map((d: { state: string }) => d.state)).toEqual(['sent', 'sent'])
  })

  it('withdrawing a sent certificate sends each address it went to a notice, once, without the PDF', async () => {
    const cert = await issued()
    fake = await startSmtpFake()
    cleanups.push(() => fake.stop())
    const worker = workerOn(fake.port, 'w-withdraw')
    await worker.runOnce()
    expect(fake.messages).toHaveLength(receiving.length)
    const reason = 'The lot was coated to an older edition of the spec'
    const res = await request(app)
      .post(`/api/certificates/${cert.id}/revoke`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason })
    expect(res.status).toBe(200)
    const rows = (res.body as CertificateDetail).deliveries!
    const of = (kind: string) =>
      rows
        .filter((d) => d.kind === kind)
        .map((d) => `${d.recipientEmail} ${d.state}`)
        .sort()
    expect(of('certificate')).toEqual([...receiving].sort().map((e) => `${e} sent`))
    expect(of('withdrawal')).toEqual([...receiving].sort().map((e) => `${e} queued`))

    await worker.runOnce()
    await worker.runOnce()
    const notices = fake.messages.slice(receiving.length)
    expect(fake.envelopes.slice(receiving.length).flat().sort()).toEqual([...receiving].sort())
    for (const mail of notices) {
      expect(mail.subject).toBe(
        `Certificate of conformance ${cert.number} withdrawn — lot ${cert.lotNumber}, order ${cert.orderRef}`,
      )
      expect(mail.text).toContain(`Reason: ${reason}`)
      expect(mail.text).toContain(cert.verifyUrl)
      expect(mail.attachments).toHaveLength(0)
    }
    expect((await outboxOf(cert.id)).every((r) => r.status === 'sent')).toBe(true)
  })

  it('a certificate withdrawn before its e-mail went out: the e-mail stops and no notice is sent', async () => {
    const cert = await issued()
    const res = await request(app)
      .post(`/api/certificates/${cert.id}/revoke`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Issued to the wrong order by mistake' })
    expect(res.status).toBe(200)
    fake = await startSmtpFake()
    cleanups.push(() => fake.stop())
    await workerOn(fake.port, 'w-withdraw-early').runOnce()
    expect(fake.messages).toHaveLength(0)
    const rows = await outboxOf(cert.id)
    expect(rows.map((r) => r.status)).toEqual(receiving.map(() => 'failed'))
    expect(rows.every((r) => r.last_error?.startsWith('Not sent'))).toBe(true)
  })

  it('waits while the SMTP server is down (queued, with the error) and delivers once it is back', async () => {
    const cert = await issued()
    const port = await freePort()
    const worker = workerOn(port, 'w-down')
    await worker.runOnce()
    const waiting = await outboxOf(cert.id)
    expect(waiting.map((r) => r.status)).toEqual(['queued', 'queued'])
    expect(
      waiting.every((r) => r.attempts === 1 && /ECONNREFUSED|connect/i.test(r.last_error ?? '')),
    ).toBe(true)
    const detail = await request(app)
      .get(`/api/certificates/${cert.id}`)
      .set('Authorization', w.supervisor.auth)
    expect(detail.body.deliveries[0].lastError).toMatch(/ECONNREFUSED|connect/i)
    fake = await startSmtpFake(port)
    cleanups.push(() => fake.stop())
    worker.start()
    await until(async () => (await outboxOf(cert.id)).every((r) => r.status === 'sent'))
    expect(fake.envelopes.flat().sort()).toEqual([...receiving].sort())
  })

  it('two workers on one database: each message is delivered exactly once', async () => {
    const certs = [await issued(), await issued(), await issued()]
    // A slow SMTP server, so both workers are busy at the same time.
    fake = await startSmtpFake(0, 150)
    cleanups.push(() => fake.stop())
    const a = workerOn(fake.port, 'w-a')
    const b = workerOn(fake.port, 'w-b')
    await Promise.all([a.runOnce(), b.runOnce(), a.runOnce(), b.runOnce()])
    a.start()
    b.start()
    await until(async () => {
      const rows = (await Promise.all(certs.map((c) => outboxOf(c.id)))).flat()
      return rows.every((r) => r.status === 'sent')
    })
    const subjects = fake.messages.map(
      (m) => `${m.subject} → ${fake.envelopes[fake.messages.indexOf(m)]}`,
    )
    expect(new Set(subjects).size).toBe(subjects.length)
    expect(fake.messages).toHaveLength(certs.length * receiving.length)
  })

  it('a claimed message is invisible to the other worker while its lease runs', async () => {
    const cert = await issued()
    fake = await startSmtpFake(0, 400)
    cleanups.push(() => fake.stop())
    const a = workerOn(fake.port, 'w-lease-a')
    const b = workerOn(fake.port, 'w-lease-b')
    const first = a.runOnce()
    await until(async () => (await outboxOf(cert.id)).every((r) => r.status === 'sending'))
    expect(await b.runOnce()).toBe(0)
    expect(await first).toBe(2)
  })

  it('gives up after the maximum attempts (failed, with the error); a resend queues it again', async () => {
    const cert = await issued()
    const port = await freePort()
    const worker = workerOn(port, 'w-fail')
    worker.start()
    await until(async () => (await outboxOf(cert.id)).every((r) => r.status === 'failed'))
    const failed = await outboxOf(cert.id)
    expect(failed.every((r) => r.attempts === FAST_RETRY.maxAttempts)).toBe(true)
    const page = await request(app)
      .get(`/api/certificates/${cert.id}`)
      .set('Authorization', w.supervisor.auth)
    expect(page.body.deliveries.map((d: { state: string }) => d.state)).toEqual([
      'failed',
      'failed',
    ])
    await worker.stop()

    const resend = await request(app)
      .post(`/api/certificates/${cert.id}/resend`)
      .set('Authorization', w.supervisor.auth)
      .send({})
    expect(resend.status).toBe(200)
    expect(
      resend.body.deliveries.map((d: { state: string; attempts: number }) => [d.state, d.attempts]),
    ).toEqual([
      ['queued', 0],
      ['queued', 0],
    ])
    fake = await startSmtpFake(port)
    cleanups.push(() => fake.stop())
    await workerOn(port, 'w-fail-2').runOnce()
    expect((await outboxOf(cert.id)).map((r) => r.status)).toEqual(['sent', 'sent'])
  })

  it('backs off 10 s · 2^(n−1), capped at 15 min', () => {
    expect([1, 2, 3, 4].map((n) => retryDelayMs(n))).toEqual([10_000, 20_000, 40_000, 80_000])
    expect(retryDelayMs(20)).toBe(15 * 60_000)
  })
})
