import type { AddressInfo } from 'node:net'
import { SMTPServer } from 'smtp-server'

/**
 * An SMTP server on loopback that accepts and discards every message: the demo seed issues
 * certificates, and their e-mails should leave the outbox at the start instead of being retried
 * (and logged) during the measurements.
 */
export async function startSmtpSink(): Promise<{
  port: number
  received: () => number
  stop: () => Promise<void>
}> {
  let received = 0
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, _session, callback) {
      stream.on('end', () => {
        received += 1
        callback()
      })
      stream.resume()
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => resolve())
  })
  return {
    port: (server.server.address() as AddressInfo).port,
    received: () => received,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
