import request from 'supertest'
import sharp from 'sharp'
import type { Express } from 'express'
import { CustomerContact, DefectType } from '../../../server/db/models'
import { createUser, tokenFor } from '../support/fixtures'
import { ROLES, type Role } from '../../../shared/api/roles'
import {
  GOOD_SPOTS_UM,
  decide,
  inspectedLot,
  reviewWorld,
  submit,
  uuid,
  type ReviewWorld,
} from '../review/reviewSupport'

/** One real record of every kind a route path can name, so allowed roles reach the handler. */
export interface WorldIds {
  user: number
  customer: number
  contact: number
  spec: number
  specVersion: number
  instrument: number
  lot: number
  releasedLot: number
  part: number
  reading: string
  photo: number
  nonconformance: number
  defectType: number
  certificate: number | null
  verifyCode: string | null
  lotNumber: string
  releasedLotNumber: string
}

export interface SecurityWorld {
  review: ReviewWorld
  auth: Record<Role, string>
  ids: WorldIds
}

/** A small real PNG (sharp makes it), for photo uploads. */
export function smallPng(widthPx = 16, heightPx = 16): Promise<Buffer> {
  return sharp({
    create: { width: widthPx, height: heightPx, channels: 3, background: { r: 40, g: 120, b: 60 } },
  })
    .png()
    .toBuffer()
}

function ok(res: request.Response, what: string, status = [200, 201]) {
  if (!status.includes(res.status)) {
    throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body).slice(0, 400)}`)
  }
  return res.body
}

/** Issues a certificate for a lot that is inspected, submitted and released; null while the route is missing. */
export async function releasedLotWithCertificate(app: Express, w: ReviewWorld) {
  const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM])
  ok(await submit(app, w.operator, lot.id), 'submit')
  ok(await decide(app, w, w.supervisor, lot.id, 'release'), 'release')
  const cert = await request(app)
    .post(`/api/lots/${lot.id}/certificates`)
    .set('Authorization', w.supervisor.auth)
    .send({ kind: '3.1' })
  if (cert.status === 404 && cert.body?.error?.message?.startsWith('No such route')) {
    return { lot, certificate: null }
  }
  const body = ok(cert, 'issue certificate') as { id: number; verifyCode?: string; number: string }
  return { lot, certificate: body }
}

export async function buildSecurityWorld(app: Express): Promise<SecurityWorld> {
  const w = await reviewWorld(app)
  const auth = {} as Record<Role, string>
  for (const role of ROLES) {
    const user = await createUser(role)
    auth[role] = await tokenFor(app, user)
  }
  const bystander = await createUser('operator')
  const contact = await CustomerContact.create({
    customerId: w.customerId,
    name: 'Works QA desk',
    email: `qa-${uuid().slice(0, 6)}@water.example`,
  })

  const open = await inspectedLot(app, w, [GOOD_SPOTS_UM])
  const partId = open.partIds[0]!
  const part = ok(
    await request(app).get(`/api/parts/${partId}`).set('Authorization', w.supervisor.auth),
    'part',
  ) as { readings: { id: string }[] }
  const photo = ok(
    await request(app)
      .post(`/api/parts/${partId}/photos`)
      .set('Authorization', w.operator.auth)
      .field('clientId', uuid())
      .field('caption', 'Edge of flange')
      .attach('file', await smallPng(), { filename: 'flange.png', contentType: 'image/png' }),
    'photo',
  ) as { id: number }
  const defectType =
    (await DefectType.findOne({ where: { active: true } })) ??
    (await DefectType.create({ code: `sec-${uuid().slice(0, 6)}`, label: 'Test defect' }))
  const nc = ok(
    await request(app)
      .post('/api/nonconformances')
      .set('Authorization', w.supervisor.auth)
      .send({
        lotId: open.id,
        partIds: [partId],
        defectTypeId: defectType.id,
        description: 'Run on the flange face',
      }),
    'nonconformance',
  ) as { id: number }

  const released = await releasedLotWithCertificate(app, w)
  return {
    review: w,
    auth,
    ids: {
      user: bystander.id,
      customer: w.customerId,
      contact: contact.id,
      spec: w.specId,
      specVersion: 1,
      instrument: w.ids.gauge,
      lot: open.id,
      releasedLot: released.lot.id,
      part: partId,
      reading: part.readings[0]!.id,
      photo: photo.id,
      nonconformance: nc.id,
      defectType: defectType.id,
      certificate: released.certificate?.id ?? null,
      verifyCode: released.certificate?.verifyCode ?? null,
      lotNumber: open.lotNumber,
      releasedLotNumber: released.lot.lotNumber,
    },
  }
}

/**
 * The record a path's `:id` names is the resource before it (`/api/lots/:id/...` → a lot).
 * A path the table does not know keeps the placeholder 1, which still passes the role check first.
 */
export function fillPath(path: string, ids: WorldIds): string {
  const byBase: [RegExp, string | number | null][] = [
    [/^\/api\/users\/:id/, ids.user],
    [/^\/api\/customers\/:id/, ids.customer],
    [/^\/api\/specs\/:id/, ids.spec],
    [/^\/api\/instruments\/:id/, ids.instrument],
    [/^\/api\/lots\/:id/, ids.lot],
    [/^\/api\/parts\/:id/, ids.part],
    [/^\/api\/readings\/:id/, ids.reading],
    [/^\/api\/photos\/:id/, ids.photo],
    [/^\/api\/nonconformances\/:id/, ids.nonconformance],
    [/^\/api\/defect-types\/:id/, ids.defectType],
    [/^\/api\/certificates\/:id/, ids.certificate],
  ]
  let out = path
  for (const [pattern, id] of byBase) {
    if (pattern.test(out)) out = out.replace(':id', String(id ?? 1))
  }
  return out
    .replace(':contactId', String(ids.contact))
    .replace(':version', String(ids.specVersion))
    .replace(':section', 'notes')
    .replace(':code', ids.verifyCode ?? 'A'.repeat(22))
    .replace(/:[A-Za-z]+/g, '1')
}

export const routeKey = (r: { method: string; path: string }) =>
  `${r.method.toUpperCase()} ${r.path}`
