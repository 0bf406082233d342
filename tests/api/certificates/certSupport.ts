/**
 * Certificate tests: released lots built through the real floor and review routes, customer
 * contacts and users, and an in-process SMTP fake (smtp-server + mailparser) on loopback.
 */
import { createServer, type AddressInfo } from 'node:net'
import request from 'supertest'
import type { Express } from 'express'
import { SMTPServer } from 'smtp-server'
import { simpleParser, type ParsedMail } from 'mailparser'
import { Customer, CustomerContact } from '../../../server/db/models'
import { createUser, tokenFor } from '../support/fixtures'
import {
  GOOD_SPOTS_UM,
  decide,
  inspectedLot,
  submit,
  type ReviewWorld,
} from '../review/reviewSupport'

export async function withContacts(customerId: number, unit: 'um' | 'mil' = 'mil') {
  await Customer.update(
    { thicknessUnit: unit, address: '1 Test Reservoir Road (fictional)' },
    { where: { id: customerId } },
  )
  const tag = Math.random().toString(36).slice(2, 8)
  const contacts = await CustomerContact.bulkCreate([
    { customerId, name: 'Certificates inbox', email: `certs-${tag}@water.example` },
    { customerId, name: 'Buyer', email: `buyer-${tag}@water.example` },
    // Neither of these may get the e-mail: one does not receive certificates, one has left.
    {
      customerId,
      name: 'Accounts',
      email: `accounts-${tag}@water.example`,
      receivesCertificates: false,
    },
    { customerId, name: 'Former buyer', email: `former-${tag}@water.example`, active: false },
  ])
  return { receiving: contacts.slice(0, 2).map((c) => c.email), all: contacts }
}

export async function customerUser(app: Express, customerId: number) {
  const user = await createUser('customer', { customerId })
  return { user, auth: await tokenFor(app, user) }
}

/** A lot inspected by the operator, submitted and released by the (independent) supervisor. */
export async function releasedLot(
  app: Express,
  w: ReviewWorld,
  spots: number[][][] = [GOOD_SPOTS_UM, GOOD_SPOTS_UM],
) {
  const lot = await inspectedLot(app, w, spots)
  await releaseInspected(app, w, lot.id)
  return lot
}

export async function releaseInspected(app: Express, w: ReviewWorld, lotId: number) {
  const s = await submit(app, w.operator, lotId)
  if (s.status !== 200) throw new Error(`submit: ${s.status} ${JSON.stringify(s.body)}`)
  const d = await decide(app, w, w.supervisor, lotId, 'release')
  if (d.status !== 200 && d.status !== 201)
    throw new Error(`release: ${d.status} ${JSON.stringify(d.body)}`)
}

export function issue(app: Express, auth: string, lotId: number, kind?: string) {
  return request(app)
    .post(`/api/lots/${lotId}/certificates`)
    .set('Authorization', auth)
    .send(kind ? { kind } : {})
}

export function getPdf(app: Express, auth: string, id: number) {
  return request(app)
    .get(`/api/certificates/${id}/pdf`)
    .set('Authorization', auth)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => cb(null, Buffer.concat(chunks)))
    })
}

/** A loopback port nobody listens on (bound and released at once). */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.on('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo
      s.close(() => resolve(port))
    })
  })
}

export interface SmtpFake {
  port: number
  messages: ParsedMail[]
  /** RCPT TO addresses of each message, in arrival order. */
  envelopes: string[][]
  stop(): Promise<void>
}

/** smtp-server on 127.0.0.1, no auth, no TLS; every message parsed with mailparser. */
export async function startSmtpFake(port = 0, delayMs = 0): Promise<SmtpFake> {
  const messages: ParsedMail[] = []
  const envelopes: string[][] = []
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (mail) => {
          if (delayMs) await new Promise((r) => setTimeout(r, delayMs))
          messages.push(mail)
          envelopes.push(session.envelope.rcptTo.map((r) => r.address))
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => resolve())
  })
  const actual = (server.server.address() as AddressInfo).port
  return {
    port: actual,
    messages,
    envelopes,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
