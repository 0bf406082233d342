import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import sharp from 'sharp'
import { createApp } from '../../../server/app'
import { markLotCertificatesForReissue } from '../../../server/api/review/certificatesHook'
import { sequelize } from '../../../server/db'
import { auditFor } from '../setup/setupFixtures'
import {
  GOOD_SPOTS_UM,
  THIN_SPOTS_UM,
  decide,
  lotVersion,
  reviewWorld,
  submittedLot,
  type ReviewWorld,
} from './reviewSupport'
import { spotReadings, uuid } from '../floor/floorSupport'

const app = createApp()
let w: ReviewWorld

beforeAll(async () => {
  w = await reviewWorld(app)
})

describe('released means frozen, until reopened with a reason', () => {
  it('a change to a released lot answers 409 saying how to proceed; reopen lets it change again', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'release')
    const readings = await request(app)
      .post(`/api/parts/${lot.partIds[0]}/readings`)
      .set('Authorization', w.operator.auth)
      .send({ readings: spotReadings(w.ids.gauge, [[400, 400, 400]]) })
    expect(readings.status).toBe(409)
    expect(readings.body.error.message).toContain('reopen the lot with a reason')
    const patch = await request(app)
      .patch(`/api/parts/${lot.partIds[0]}`)
      .set('Authorization', w.operator.auth)
      .send({ version: 1, heatNumber: 'HX-1' })
    expect(patch.status).toBe(409)
    expect(patch.body.error.message).toContain('reopen the lot with a reason')

    const noReason = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: '', version: await lotVersion(app, w, lot.id) })
    expect(noReason.status).toBe(400)
    expect(noReason.body.error.details[0].field).toBe('body.reason')
    const byOperator = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.operator.auth)
      .send({ reason: 'Wrong heat number', version: await lotVersion(app, w, lot.id) })
    expect(byOperator.status).toBe(403)

    const reopen = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({
        reason: 'Heat number typed wrong on VB-1',
        version: await lotVersion(app, w, lot.id),
      })
    expect(reopen.status).toBe(200)
    expect(reopen.body).toMatchObject({ lot: { status: 'open' }, certificatesMarked: 0 })
    const event = (await auditFor('lot', lot.id)).find((e) => e.action === 'lot.reopen')!
    expect(event.before).toMatchObject({ status: 'released' })
    expect(event.after).toMatchObject({ status: 'open', reason: 'Heat number typed wrong on VB-1' })
    const part = await request(app)
      .get(`/api/parts/${lot.partIds[0]}`)
      .set('Authorization', w.operator.auth)
    const fixed = await request(app)
      .patch(`/api/parts/${lot.partIds[0]}`)
      .set('Authorization', w.operator.auth)
      .send({ version: part.body.version, heatNumber: 'HX-1' })
    expect(fixed.status).toBe(200)
  })

  it('reopening answers how many certificates it marked for reissue (none for a lot without any)', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'release')
    const reopen = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({
        reason: 'Customer asked for the cure chart',
        version: await lotVersion(app, w, lot.id),
      })
    expect(reopen.status).toBe(200)
    expect(reopen.body.certificatesMarked).toBe(0)
  })

  it('the reissue hook marks every certificate of that lot, and no other', async () => {
    // A stand-in table in this session only (it shadows the certificate feature's own table),
    // rolled back at the end: the hook's SQL is checked without building real certificates.
    const t = await sequelize.transaction()
    try {
      await sequelize.query(
        'CREATE TEMP TABLE certificates (id serial PRIMARY KEY, lot_id integer NOT NULL, needs_reissue boolean NOT NULL DEFAULT false) ON COMMIT DROP',
        { transaction: t },
      )
      await sequelize.query('INSERT INTO certificates (lot_id) VALUES (41), (41), (42)', {
        transaction: t,
      })
      expect(await markLotCertificatesForReissue(41, t)).toBe(2)
      const [rows] = await sequelize.query(
        'SELECT lot_id, needs_reissue FROM certificates ORDER BY id',
        { transaction: t },
      )
      expect(rows).toEqual([
        { lot_id: 41, needs_reissue: true },
        { lot_id: 41, needs_reissue: true },
        { lot_id: 42, needs_reissue: false },
      ])
      expect(await markLotCertificatesForReissue(41, t)).toBe(0) // already marked
    } finally {
      await t.rollback()
    }
  })

  it('a stale version on reopen is a 409 with the current lot', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const stale = await lotVersion(app, w, lot.id)
    await decide(app, w, w.supervisor, lot.id, 'release')
    const res = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Recheck', version: stale })
    expect(res.status).toBe(409)
    expect(res.body.error.details.current.status).toBe('released')
  })
})

describe('photos of a nonconformance', () => {
  it('are stored with the nonconformance, also while the lot is in review', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const jpeg = await sharp({
      create: { width: 640, height: 480, channels: 3, background: '#a63' },
    })
      .jpeg()
      .toBuffer()
    const res = await request(app)
      .post(`/api/nonconformances/${nc.id}/photos`)
      .set('Authorization', w.operator.auth)
      .field('clientId', uuid())
      .field('caption', 'Thin film at the flange edge')
      .attach('file', jpeg, 'flange.jpg')
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      width: 640,
      height: 480,
      caption: 'Thin film at the flange edge',
    })
    const detail = await request(app)
      .get(`/api/nonconformances/${nc.id}`)
      .set('Authorization', w.supervisor.auth)
    expect(detail.body.photos.map((p: { id: number }) => p.id)).toEqual([res.body.id])
    const [rows] = await sequelize.query(
      `SELECT nonconformance_id, lot_id FROM photos WHERE id = ${res.body.id}`,
    )
    expect(rows).toEqual([{ nonconformance_id: nc.id, lot_id: lot.id }])
  })
})
