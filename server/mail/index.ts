/** The certificate mail: the outbox worker started beside the HTTP server (server/workers.ts). */
import { env } from '../config/env'
import { OutboxWorker } from './outboxWorker'
import { createSmtpSender } from './transport'

export { OutboxWorker } from './outboxWorker'
export { createSmtpSender, type MailSender, type OutgoingMail } from './transport'

/** Starts the worker on SMTP_HOST:SMTP_PORT, polling every OUTBOX_POLL_MS; answers its stop. */
export function startOutboxWorker(): () => Promise<void> {
  const sender = createSmtpSender({ host: env.SMTP_HOST, port: env.SMTP_PORT })
  const worker = new OutboxWorker({
    sender,
    from: env.MAIL_FROM,
    pollMs: env.OUTBOX_POLL_MS,
  }).start()
  return async () => {
    await worker.stop()
    sender.close()
  }
}
