/**
 * The mail outbox worker. Each pass:
 *   1. claims due rows in one short statement — SELECT … FOR UPDATE SKIP LOCKED inside an
 *      UPDATE that sets status 'sending', a lease (locked_until) and its own id — and commits, so
 *      a second process running the same pass skips the rows this one holds and never sees them
 *      as due until the lease runs out;
 *   2. sends each claimed message (outside any transaction: SMTP can take seconds);
 *   3. marks it 'sent', or records the error and the next attempt with exponential backoff
 *      ('failed' only after the maximum attempts).
 * The lease is far longer than the bounded SMTP timeouts, so a message is sent twice only if a
 * process dies between the SMTP "250 OK" and step 3 — the one case no outbox can rule out.
 */
import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { sequelize } from '../db'
import { logger as rootLogger } from '../lib/logger'
import { DEFAULT_RETRY, retryDelayMs, type RetryPolicy } from './backoff'
import type { MailSender, OutgoingMail } from './transport'

export interface OutboxWorkerOptions {
  sender: MailSender
  from: string
  pollMs: number
  leaseMs?: number
  batchSize?: number
  retry?: RetryPolicy
  workerId?: string
}

interface ClaimedRow {
  id: string
  certificate_id: number
  recipient_name: string
  recipient_email: string
  subject: string
  body_text: string
  attempts: number
  kind: 'certificate' | 'withdrawal'
}

export class OutboxWorker {
  readonly workerId: string
  private readonly leaseMs: number
  private readonly batchSize: number
  private readonly retry: RetryPolicy
  private timer: NodeJS.Timeout | null = null
  private pass: Promise<number> | null = null
  private stopped = true
  private readonly log

  constructor(private readonly options: OutboxWorkerOptions) {
    this.workerId = options.workerId ?? `outbox-${process.pid}-${randomBytes(3).toString('hex')}`
    this.leaseMs = options.leaseMs ?? 120_000
    this.batchSize = options.batchSize ?? 10
    this.retry = options.retry ?? DEFAULT_RETRY
    this.log = rootLogger.child({ worker: this.workerId })
  }

  start(): this {
    this.stopped = false
    this.schedule(0)
    return this
  }

  /** Waits for the pass in progress (a message being sent is finished and marked), then stops. */
  async stop(): Promise<void> {
    this.stopped = true
    if (this.timer) clearTimeout(this.timer)
    this.timer = null
    await this.pass?.catch(() => 0)
  }

  private schedule(delayMs: number) {
    if (this.stopped) return
    this.timer = setTimeout(() => {
      this.pass = this.runOnce()
      void this.pass
        .catch((err: unknown) => {
          this.log.error({ err }, 'outbox pass failed')
          return 0
        })
        // A full batch means more may be due: go again at once.
        .then((n) => this.schedule(n >= this.batchSize ? 0 : this.options.pollMs))
    }, delayMs)
  }

  /** One pass: claim, send, mark. Answers how many messages it handled. */
  async runOnce(): Promise<number> {
    const rows = await this.claim()
    for (const row of rows) await this.deliver(row)
    return rows.length
  }

  private claim(): Promise<ClaimedRow[]> {
    return sequelize.query<ClaimedRow>(
      `WITH due AS (
         SELECT id FROM mail_outbox
          WHERE (status = 'queued' AND next_attempt_at <= now())
             OR (status = 'sending' AND locked_until < now())
          ORDER BY next_attempt_at, id
          LIMIT $1
          FOR UPDATE SKIP LOCKED)
       UPDATE mail_outbox m
          SET status = 'sending', locked_until = now() + make_interval(secs => $2::double precision),
              locked_by = $3, attempts = m.attempts + 1, last_attempt_at = now(), updated_at = now()
         FROM due WHERE m.id = due.id
       RETURNING m.id, m.certificate_id, m.recipient_name, m.recipient_email, m.subject,
                 m.body_text, m.attempts, m.kind`,
      {
        bind: [this.batchSize, this.leaseMs / 1000, this.workerId],
        type: QueryTypes.SELECT,
      },
    )
  }

  private async deliver(row: ClaimedRow): Promise<void> {
    // A withdrawal notice goes out whatever the certificate's state, and carries no PDF.
    let attachments: OutgoingMail['attachments'] = []
    if (row.kind === 'certificate') {
      const [cert] = await sequelize.query<{ number: string; state: string; pdf: Buffer }>(
        'SELECT number, state, pdf FROM certificates WHERE id = $1',
        { bind: [row.certificate_id], type: QueryTypes.SELECT },
      )
      if (!cert || cert.state !== 'valid') {
        // Withdrawn or replaced before it went out: sending it now would mislead the customer.
        await this.finish(
          row,
          'failed',
          `Not sent: the certificate was ${cert?.state ?? 'removed'} before it went out`,
        )
        return
      }
      attachments = [
        {
          filename: `certificate-${cert.number}.pdf`,
          content: Buffer.from(cert.pdf),
          contentType: 'application/pdf',
        },
      ]
    }
    try {
      const { messageId } = await this.options.sender.send({
        from: this.options.from,
        to: { name: row.recipient_name, address: row.recipient_email },
        subject: row.subject,
        text: row.body_text,
        attachments,
      })
      await sequelize.query(
        `UPDATE mail_outbox SET status = 'sent', sent_at = now(), message_id = $3, last_error = NULL,
                locked_until = NULL, locked_by = NULL, updated_at = now()
          WHERE id = $1 AND locked_by = $2 AND status = 'sending'`,
        { bind: [row.id, this.workerId, messageId] },
      )
      this.log.info(
        { outboxId: row.id, to: row.recipient_email, kind: row.kind },
        'certificate e-mail sent',
      )
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err)
      const giveUp = row.attempts >= this.retry.maxAttempts
      await this.finish(row, giveUp ? 'failed' : 'queued', message.slice(0, 1000))
      this.log.warn(
        { outboxId: row.id, attempts: row.attempts, err: message },
        'certificate e-mail not sent',
      )
    }
  }

  private async finish(row: ClaimedRow, status: 'queued' | 'failed', error: string) {
    const delayS = retryDelayMs(row.attempts, this.retry) / 1000
    await sequelize.query(
      `UPDATE mail_outbox SET status = $3, last_error = $4,
              next_attempt_at = now() + make_interval(secs => $5::double precision),
              locked_until = NULL, locked_by = NULL, updated_at = now()
        WHERE id = $1 AND locked_by = $2 AND status = 'sending'`,
      { bind: [row.id, this.workerId, status, error, delayS] },
    )
  }
}
