/**
 * Fault: the SMTP server is down while certificates are issued, and two app processes (each with
 * its outbox worker, as `npm start` runs it) share one database. Once the SMTP server is back,
 * every certificate e-mail is delivered — to each receiving contact exactly once, with the PDF
 * as stored — although both workers polled the same outbox the whole time.
 */
import { createHash } from 'node:crypto'
import { mkdirSync, readFileSync, rmSync } from 'node:fs'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../../scripts/bench/serverProcess'
import { faultDatabase, freePort, serverEnv, sleep, type FaultDatabase } from './support'

const CERTIFICATES = 6
const logOf = (i: number) => `test-output/faults/certificate-mail-outage-server-${i + 1}.log`

let db: FaultDatabase
const servers: RunningServer[] = []
let stopSmtp: (() => Promise<void>) | null = null

beforeAll(() => {
  mkdirSync('test-output/faults', { recursive: true })
  db = faultDatabase('pg-faults-mail', 54379)
})

afterAll(async () => {
  for (const s of servers) await s.stop('SIGKILL')
  await stopSmtp?.()
  db?.cluster.stop()
})

async function until(what: string, check: () => Promise<boolean>, timeoutMs: number) {
  const end = Date.now() + timeoutMs
  while (Date.now() < end) {
    if (await check()) return
    await sleep(200)
  }
  throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`)
}

describe('certificate e-mail while the SMTP server is down, two app processes', () => {
  it('delivers each certificate to each receiving contact exactly once when SMTP is back', async () => {
    const { createApp } = await import('../../server/app')
    const { reviewWorld } = await import('../api/review/reviewSupport')
    const { releasedLot, startSmtpFake, withContacts } =
      await import('../api/certificates/certSupport')
    const { sequelize } = await import('../../server/db')
    const app = createApp() // in this process only to build released lots (no outbox worker here)
    const w = await reviewWorld(app)
    const { receiving } = await withContacts(w.customerId)
    const lots = []
    for (let i = 0; i < CERTIFICATES; i++) lots.push(await releasedLot(app, w))
    await sequelize.close()

    const smtpPort = await freePort() // nothing listens there yet: the SMTP server is down
    for (let i = 0; i < 2; i++) {
      rmSync(logOf(i), { force: true })
      const port = await freePort()
      servers.push(
        await startServer({
          port,
          databaseUrl: db.url,
          logFile: logOf(i),
          env: serverEnv(db, {
            SMTP_HOST: '127.0.0.1',
            SMTP_PORT: String(smtpPort),
            OUTBOX_POLL_MS: '200',
          }),
        }),
      )
    }

    // Issue through both processes, alternately, while SMTP is down.
    const numbers: string[] = []
    for (const [i, lot] of lots.entries()) {
      const res = await fetch(`${servers[i % 2]!.base}/api/lots/${lot.id}/certificates`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', authorization: w.supervisor.auth },
        body: '{}',
      })
      expect(res.status).toBe(201)
      numbers.push(((await res.json()) as { number: string }).number)
    }

    const client = new pg.Client({ connectionString: db.url })
    await client.connect()
    const outbox = async () =>
      (
        await client.query<{
          id: string
          number: string
          recipient_email: string
          status: string
          attempts: number
          last_error: string | null
          locked_by: string | null
          pdf_sha256: string
        }>(`SELECT m.id, c.number, m.recipient_email, m.status, m.attempts, m.last_error, m.locked_by, c.pdf_sha256
              FROM mail_outbox m JOIN certificates c ON c.id = m.certificate_id ORDER BY m.id`)
      ).rows
    try {
      expect((await outbox()).length).toBe(CERTIFICATES * receiving.length)
      // While down: every message tried at least once, refused, queued again for later.
      await until(
        'a failed first attempt of every message',
        async () =>
          (await outbox()).every((m) => m.attempts >= 1 && m.status === 'queued' && m.last_error),
        20_000,
      )
      const whileDown = await outbox()

      await sleep(2000) // down a while longer
      const fake = await startSmtpFake(smtpPort)
      stopSmtp = fake.stop
      const upAt = Date.now()
      // The first retry is 10 s after the failed attempt (server/mail/backoff.ts), the next 20 s.
      await until(
        'every message sent',
        async () => (await outbox()).every((m) => m.status === 'sent'),
        90_000,
      )
      const deliveredAfterMs = Date.now() - upAt
      await sleep(3000) // both workers keep polling: nothing more may arrive
      const sent = await outbox()

      const delivered = fake.messages.map((m, i) => ({
        subject: m.subject ?? '',
        to: fake.envelopes[i]!,
        pdfSha256: m.attachments[0]
          ? createHash('sha256').update(m.attachments[0].content).digest('hex')
          : null,
      }))
      const report = {
        certificates: numbers,
        outboxRows: sent.length,
        attemptsWhileDown: [...new Set(whileDown.map((m) => m.attempts))],
        errorWhileDown: whileDown[0]!.last_error,
        deliveredAfterSmtpUpMs: deliveredAfterMs,
        messagesReceived: delivered.length,
        // Each process's worker logs every attempt that failed while SMTP was down.
        failedAttemptsLoggedByProcess: [0, 1].map(
          (i) =>
            readFileSync(logOf(i), 'utf8')
              .split('\n')
              .filter((l) => l.includes('certificate e-mail not sent')).length,
        ),
      }
      console.log(`certificate mail outage: ${JSON.stringify(report, null, 2)}`)

      expect(delivered.length).toBe(CERTIFICATES * receiving.length)
      for (const number of numbers) {
        const row = sent.find((m) => m.number === number)!
        for (const email of receiving) {
          const mails = delivered.filter((d) => d.subject.includes(number) && d.to.includes(email))
          expect(mails, `${number} → ${email}`).toHaveLength(1)
          expect(mails[0]!.to).toEqual([email])
          expect(mails[0]!.pdfSha256, `${number}: the PDF as stored`).toBe(row.pdf_sha256)
        }
      }
      // Both processes' workers were working the one outbox (each claimed messages while down).
      expect(report.failedAttemptsLoggedByProcess.every((n) => n > 0)).toBe(true)
      expect(sent.every((m) => m.locked_by === null)).toBe(true)
    } finally {
      await client.end()
    }
  })
})
