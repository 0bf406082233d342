import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { DefectType, GaugeReading, Part, SectionRecord } from '../../../server/db/models'
import { sequelize } from '../../../server/db'
import { QueryTypes } from 'sequelize'
import type { NonconformanceRow } from '../../../shared/api/review'
import {
  GOOD_SPOTS_UM,
  THIN_SPOTS_UM,
  decide,
  inspectPart,
  reviewWorld,
  submit,
  submittedLot,
  type ReviewWorld,
} from './reviewSupport'

const app = createApp()
let w: ReviewWorld

beforeAll(async () => {
  w = await reviewWorld(app)
})

async function getNc(id: number): Promise<NonconformanceRow> {
  return (
    await request(app).get(`/api/nonconformances/${id}`).set('Authorization', w.supervisor.auth)
  ).body
}
function disposition(id: number, body: Record<string, unknown>) {
  return request(app)
    .post(`/api/nonconformances/${id}/disposition`)
    .set('Authorization', w.supervisor.auth)
    .send(body)
}
function close(id: number, body: Record<string, unknown>) {
  return request(app)
    .post(`/api/nonconformances/${id}/close`)
    .set('Authorization', w.supervisor.auth)
    .send(body)
}

describe('repair → retest → close → release', () => {
  it('walks the whole loop; round 1 is kept beside round 2', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM, GOOD_SPOTS_UM])
    const [thinPartId, goodPartId] = lot.partIds as [number, number]
    const nc = lot.submitted.nonconformancesOpened[0]!
    const hold = await decide(app, w, w.supervisor, lot.id, 'hold', 'Thin film on VB-1: recoat')
    expect(hold.body.lot.status).toBe('on-hold')

    // Closing before any disposition is refused.
    const early = await close(nc.id, { verification: 'Looked fine', version: nc.version })
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('nc_not_dispositioned')

    const disp = await disposition(nc.id, {
      disposition: 'repair-retest',
      note: 'Touch up and re-measure',
      version: nc.version,
    })
    expect(disp.status).toBe(200)
    expect(disp.body.status).toBe('dispositioned')
    expect(disp.body.parts[0]).toMatchObject({ id: thinPartId, round: 2 })

    // The part starts round 2 with a fresh verdict; first-pass status keeps round 1's fail.
    const part = (await Part.findByPk(thinPartId))!
    expect(part.round).toBe(2)
    expect(part.verdictStatus).toBe('incomplete')
    expect(part.firstPassStatus).toBe('fail')
    expect((await Part.findByPk(goodPartId))!.round).toBe(1)
    const lotNow = await request(app)
      .get(`/api/lots/${lot.id}`)
      .set('Authorization', w.operator.auth)
    expect(lotNow.body.status).toBe('open')

    // The retest is not recorded yet: the record cannot be closed.
    const notYet = await close(nc.id, { verification: 'Recoated', version: disp.body.version })
    expect(notYet.status).toBe(409)
    expect(notYet.body.error.code).toBe('retest_not_passed')
    expect(notYet.body.error.message).toContain('VB-1')

    // The operator records the retest and submits again: no second NC for the same failure.
    expect(await inspectPart(app, w, thinPartId, GOOD_SPOTS_UM)).toBe('pass')
    const resubmit = await submit(app, w.operator, lot.id)
    expect(resubmit.status).toBe(200)
    expect(resubmit.body.nonconformancesOpened).toEqual([])
    const blocked = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(blocked.status).toBe(409)
    expect(blocked.body.error.details.blockers).toEqual([
      {
        kind: 'nonconformance',
        nonconformanceId: nc.id,
        number: nc.number,
        status: 'dispositioned',
      },
    ])

    const closed = await close(nc.id, {
      verification: 'Retest round 2: area mean 400 µm, holiday test clean',
      version: disp.body.version,
    })
    expect(closed.status).toBe(200)
    expect(closed.body.status).toBe('closed')
    expect(closed.body.closed.byId).toBe(w.supervisor.user.id)

    const release = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(release.status).toBe(201)
    expect(release.body.lot.status).toBe('released')

    // Both rounds are kept: 15 readings per round, sections of both rounds.
    const readings = await GaugeReading.findAll({ where: { partId: thinPartId } })
    expect(readings.filter((r) => r.round === 1)).toHaveLength(15)
    expect(readings.filter((r) => r.round === 2)).toHaveLength(15)
    const rounds = new Set(
      (await SectionRecord.findAll({ where: { partId: thinPartId } })).map((s) => s.round),
    )
    expect([...rounds].sort()).toEqual([1, 2])
  })

  it('a retest that fails again keeps the nonconformance open and the lot blocked', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const disp = await disposition(nc.id, { disposition: 'strip-recoat', version: nc.version })
    expect(disp.status).toBe(200)
    expect(await inspectPart(app, w, lot.partIds[0]!, THIN_SPOTS_UM)).toBe('fail')
    const resubmit = await submit(app, w.operator, lot.id)
    expect(resubmit.body.nonconformancesOpened).toEqual([]) // still covered by the dispositioned one
    const res = await close(nc.id, { verification: 'Recoated', version: disp.body.version })
    expect(res.status).toBe(409)
    expect(res.body.error.details.parts[0]).toMatchObject({
      partId: lot.partIds[0],
      round: 2,
      status: 'fail',
    })
  })
})

describe('use as is and scrap', () => {
  it('use as is without a concession reference is a 400 naming concessionRef', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const res = await disposition(nc.id, {
      disposition: 'use-as-is',
      note: 'Customer agreed by phone',
      version: nc.version,
    })
    expect(res.status).toBe(400)
    expect(res.body.error.details.map((d: { field: string }) => d.field)).toContain(
      'body.concessionRef',
    )
    expect((await getNc(nc.id)).status).toBe('open')
  })

  it('use as is with the concession, closed, lets the failing part ship', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM, GOOD_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const disp = await disposition(nc.id, {
      disposition: 'use-as-is',
      concessionRef: 'CON-2291-A',
      version: nc.version,
    })
    expect(disp.body).toMatchObject({
      status: 'dispositioned',
      disposition: 'use-as-is',
      concessionRef: 'CON-2291-A',
    })
    expect((await decide(app, w, w.supervisor, lot.id, 'release')).status).toBe(409)
    expect(
      (
        await close(nc.id, {
          verification: 'Concession CON-2291-A signed by the buyer, on file',
          version: disp.body.version,
        })
      ).status,
    ).toBe(200)
    const release = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(release.status).toBe(201)
  })

  it('scrap, closed, marks the part out of the shipment and lets the rest ship', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM, GOOD_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const disp = await disposition(nc.id, { disposition: 'scrap', version: nc.version })
    expect(
      (
        await close(nc.id, {
          verification: 'Part tagged red and moved to the scrap cage',
          version: disp.body.version,
        })
      ).status,
    ).toBe(200)
    const [row] = await sequelize.query<{ scrapped_by_nc: number | null }>(
      'SELECT scrapped_by_nc FROM parts WHERE id = $1',
      {
        bind: [lot.partIds[0]],
        type: QueryTypes.SELECT,
      },
    )
    expect(row!.scrapped_by_nc).toBe(nc.id)
    expect((await decide(app, w, w.supervisor, lot.id, 'release')).status).toBe(201)
  })

  it('a stale nonconformance version answers 409 with the current record', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    await disposition(nc.id, { disposition: 'scrap', version: nc.version })
    const stale = await disposition(nc.id, {
      disposition: 'use-as-is',
      concessionRef: 'X-1',
      version: nc.version,
    })
    expect(stale.status).toBe(409)
    expect(stale.body.error.details.current).toMatchObject({
      id: nc.id,
      disposition: 'scrap',
      version: nc.version + 1,
    })
  })
})

describe('nonconformances opened by hand', () => {
  it('files handling damage on a part, blocks release until closed', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM, GOOD_SPOTS_UM])
    const damage = await DefectType.create({
      code: `handling-damage-${lot.id}`,
      label: 'Handling damage (test)',
    })
    const res = await request(app)
      .post('/api/nonconformances')
      .set('Authorization', w.operator.auth)
      .send({
        lotId: lot.id,
        partIds: [lot.partIds[1]],
        defectTypeId: damage.id,
        description: 'Forklift gouge on the flange face',
      })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      source: 'manual',
      criterion: null,
      status: 'open',
      defectLabel: 'Handling damage (test)',
    })
    expect(res.body.parts.map((p: { id: number }) => p.id)).toEqual([lot.partIds[1]])
    const blocked = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(blocked.status).toBe(409)
    const list = await request(app)
      .get(`/api/nonconformances?lotId=${lot.id}&status=open`)
      .set('Authorization', w.operator.auth)
    expect(list.body.map((n: { id: number }) => n.id)).toEqual([res.body.id])
  })

  it('refuses a part of another lot, and a retired defect type', async () => {
    const a = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const b = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const type = await DefectType.create({
      code: `contamination-${a.id}`,
      label: 'Contamination (test)',
    })
    const foreign = await request(app)
      .post('/api/nonconformances')
      .set('Authorization', w.operator.auth)
      .send({
        lotId: a.id,
        partIds: [b.partIds[0]],
        defectTypeId: type.id,
        description: 'Oil drip',
      })
    expect(foreign.status).toBe(400)
    expect(foreign.body.error.details[0].field).toBe('body.partIds')
    await type.update({ active: false })
    const retired = await request(app)
      .post('/api/nonconformances')
      .set('Authorization', w.operator.auth)
      .send({
        lotId: a.id,
        partIds: [a.partIds[0]],
        defectTypeId: type.id,
        description: 'Oil drip',
      })
    expect(retired.status).toBe(400)
    expect(retired.body.error.details[0].field).toBe('body.defectTypeId')
  })

  it('only QA dispositions: an operator gets 403', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const res = await request(app)
      .post(`/api/nonconformances/${nc.id}/disposition`)
      .set('Authorization', w.operator.auth)
      .send({ disposition: 'scrap', version: nc.version })
    expect(res.status).toBe(403)
  })
})
