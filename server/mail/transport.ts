/**
 * How a message leaves Filmtrail: a small MailSender interface, with nodemailer over SMTP as the
 * one implementation. The outbox worker takes a MailSender, so tests point it at their own SMTP
 * fake (smtp-server) without mocking nodemailer.
 */
import nodemailer from 'nodemailer'

export interface OutgoingMail {
  from: string
  to: { name: string; address: string }
  subject: string
  text: string
  attachments: { filename: string; content: Buffer; contentType: string }[]
}

export interface MailSender {
  send(mail: OutgoingMail): Promise<{ messageId: string }>
  close(): void
}

export interface SmtpOptions {
  host: string
  port: number
  /** Bounded, so a send always ends well inside the outbox lease (outboxWorker.ts). */
  timeoutMs?: number
}

export function createSmtpSender({ host, port, timeoutMs = 15_000 }: SmtpOptions): MailSender {
  const transport = nodemailer.createTransport({
    host,
    port,
    secure: false,
    // The local fakes (maildev, the tests' smtp-server) speak plain SMTP on loopback.
    ignoreTLS: true,
    connectionTimeout: timeoutMs,
    greetingTimeout: timeoutMs,
    socketTimeout: timeoutMs * 2,
  })
  return {
    async send(mail) {
      const info = await transport.sendMail({
        from: mail.from,
        to: { name: mail.to.name, address: mail.to.address },
        subject: mail.subject,
        text: mail.text,
        attachments: mail.attachments,
      })
      return { messageId: String(info.messageId ?? '') }
    },
    close: () => transport.close(),
  }
}
