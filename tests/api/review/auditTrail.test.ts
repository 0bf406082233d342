import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { AuditEvent } from '../../../server/db/models'
import { auditFor } from '../setup/setupFixtures'
import {
  GOOD_SPOTS_UM,
  THIN_SPOTS_UM,
  decide,
  reviewWorld,
  submittedLot,
  type ReviewWorld,
} from './reviewSupport'

const app = createApp()
let w: ReviewWorld

beforeAll(async () => {
  w = await reviewWorld(app)
})

describe('the audit table cannot be rewritten', () => {
  it('refuses UPDATE, DELETE and TRUNCATE even as raw SQL', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const count = await AuditEvent.count({ where: { lotId: lot.id } })
    expect(count).toBeGreaterThan(0)
    await expect(
      sequelize.query(`UPDATE audit_events SET note = 'edited' WHERE lot_id = ${lot.id}`),
    ).rejects.toThrow(/append-only: UPDATE refused/)
    await expect(
      sequelize.query(`DELETE FROM audit_events WHERE lot_id = ${lot.id}`),
    ).rejects.toThrow(/append-only: DELETE refused/)
    await expect(sequelize.query('TRUNCATE audit_events CASCADE')).rejects.toThrow(
      /append-only: TRUNCATE refused/,
    )
    expect(await AuditEvent.count({ where: { lotId: lot.id } })).toBe(count)
    expect(await AuditEvent.count({ where: { lotId: lot.id, note: 'edited' } })).toBe(0)
  })
})

describe('each kind of change writes its before and after', () => {
  it('submit, hold and release: the lot status and version before and after', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'hold', 'Waiting for the cure chart')
    await decide(app, w, w.supervisor2, lot.id, 'release')
    const events = (await auditFor('lot', lot.id)).filter((e) =>
      ['lot.submit', 'lot.hold', 'lot.release'].includes(e.action),
    )
    expect(events.map((e) => e.action)).toEqual(['lot.submit', 'lot.hold', 'lot.release'])
    const [sub, hold, rel] = events as [AuditEvent, AuditEvent, AuditEvent]
    expect(sub.before).toEqual({ status: 'open', version: 1 })
    expect(sub.after).toMatchObject({ status: 'awaiting-review', version: 2 })
    expect(hold.before).toEqual({ status: 'awaiting-review', version: 2 })
    expect(hold.after).toMatchObject({
      status: 'on-hold',
      version: 3,
      reason: 'Waiting for the cure chart',
      independenceWaived: false,
    })
    expect(hold.actorId).toBe(w.supervisor.user.id)
    expect(rel.before).toEqual({ status: 'on-hold', version: 3 })
    expect(rel.after).toMatchObject({ status: 'released', version: 4 })
    expect(rel.actorId).toBe(w.supervisor2.user.id)
    expect(rel.lotId).toBe(lot.id)
  })

  it('a nonconformance opened, dispositioned and closed: the record before and after each step', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const disp = await request(app)
      .post(`/api/nonconformances/${nc.id}/disposition`)
      .set('Authorization', w.supervisor.auth)
      .send({
        disposition: 'use-as-is',
        concessionRef: 'CON-77',
        note: 'Buyer accepts 10 mils on this flange',
        version: nc.version,
      })
    await request(app)
      .post(`/api/nonconformances/${nc.id}/close`)
      .set('Authorization', w.supervisor.auth)
      .send({ verification: 'Concession CON-77 on file', version: disp.body.version })
    const events = await auditFor('nonconformance', nc.id)
    expect(events.map((e) => e.action)).toEqual([
      'nonconformance.open',
      'nonconformance.disposition',
      'nonconformance.close',
    ])
    const [open, dispositioned, closed] = events as [AuditEvent, AuditEvent, AuditEvent]
    expect(open.before).toBeNull()
    expect(open.after).toMatchObject({
      number: nc.number,
      status: 'open',
      criterion: 'thickness',
      source: 'auto',
    })
    expect(dispositioned.before).toMatchObject({
      status: 'open',
      disposition: null,
      concessionRef: null,
    })
    expect(dispositioned.after).toMatchObject({
      status: 'dispositioned',
      disposition: 'use-as-is',
      concessionRef: 'CON-77',
    })
    expect(closed.before).toMatchObject({
      status: 'dispositioned',
      verification: null,
      closed: null,
    })
    expect(closed.after).toMatchObject({
      status: 'closed',
      verification: 'Concession CON-77 on file',
    })
    expect(events.every((e) => e.lotId === lot.id)).toBe(true)
  })

  it('a repair disposition audits the part moving to round 2 and the lot going back to the floor', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    await request(app)
      .post(`/api/nonconformances/${nc.id}/disposition`)
      .set('Authorization', w.supervisor.auth)
      .send({ disposition: 'repair-retest', version: nc.version })
    const part = (await auditFor('part', lot.partIds[0]!)).find(
      (e) => e.action === 'part.retest-round',
    )!
    expect(part.before).toEqual({ round: 1, verdictStatus: 'fail' })
    expect(part.after).toEqual({ round: 2, verdictStatus: 'incomplete' })
    const back = (await auditFor('lot', lot.id)).find((e) => e.action === 'lot.open-for-retest')!
    expect(back.before).toMatchObject({ status: 'awaiting-review' })
    expect(back.after).toMatchObject({ status: 'open' })
  })

  it('defect types: create and change', async () => {
    const created = await request(app)
      .post('/api/defect-types')
      .set('Authorization', w.admin.auth)
      .send({ code: 'orange-peel', label: 'Orange peel' })
    expect(created.status).toBe(201)
    const patched = await request(app)
      .patch(`/api/defect-types/${created.body.id}`)
      .set('Authorization', w.admin.auth)
      .send({ label: 'Orange peel (surface texture)' })
    expect(patched.body).toMatchObject({
      code: 'orange-peel',
      label: 'Orange peel (surface texture)',
      active: true,
    })
    const events = await auditFor('defect-type', created.body.id)
    expect(events.map((e) => e.action)).toEqual(['defect-type.create', 'defect-type.update'])
    expect(events[1]!.before).toMatchObject({ label: 'Orange peel' })
    expect(events[1]!.after).toMatchObject({ label: 'Orange peel (surface texture)' })
    const asSupervisor = await request(app)
      .post('/api/defect-types')
      .set('Authorization', w.supervisor.auth)
      .send({ code: 'sags', label: 'Sags' })
    expect(asSupervisor.status).toBe(403)
  })
})

describe('reading the trail', () => {
  it("the lot's history tells the story oldest first, with who did it", async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'hold', 'Thin film')
    const res = await request(app)
      .get(`/api/lots/${lot.id}/history`)
      .set('Authorization', w.operator.auth)
    expect(res.status).toBe(200)
    const actions = res.body.map((e: { action: string }) => e.action) as string[]
    expect(actions[0]).toBe('lot.open')
    expect(actions.indexOf('lot.submit')).toBeLessThan(actions.indexOf('nonconformance.open'))
    expect(actions.at(-1)).toBe('lot.hold')
    const hold = res.body.at(-1)
    expect(hold).toMatchObject({
      actorId: w.supervisor.user.id,
      actorName: w.supervisor.user.name,
      entityType: 'lot',
      entityId: String(lot.id),
    })
    const ats = res.body.map((e: { at: string }) => Date.parse(e.at)) as number[]
    expect([...ats].sort((a, b) => a - b)).toEqual(ats)
  })

  it('admins search by person, by record, by lot number and by period, paginated', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor2, lot.id, 'release')
    const get = (q: string, auth = w.admin.auth) =>
      request(app).get(`/api/audit?${q}`).set('Authorization', auth)

    const byPerson = await get(`actorId=${w.supervisor2.user.id}`)
    expect(byPerson.status).toBe(200)
    expect(byPerson.body.length).toBeGreaterThan(0)
    expect(
      byPerson.body.every((e: { actorId: number }) => e.actorId === w.supervisor2.user.id),
    ).toBe(true)

    const byRecord = await get(`entityType=lot&entityId=${lot.id}`)
    expect(byRecord.body.map((e: { action: string }) => e.action)).toEqual([
      'lot.release',
      'lot.submit',
      'lot.open',
    ])

    const byLot = await get(`lotNumber=${lot.lotNumber.toLowerCase()}&limit=2&offset=0`)
    expect(byLot.body).toHaveLength(2)
    const total = Number(byLot.headers['x-total-count'])
    expect(total).toBeGreaterThan(5) // lot, part, 6 sections, readings batch, submit, release
    const page2 = await get(`lotNumber=${lot.lotNumber}&limit=2&offset=2`)
    expect(page2.body[0].id).not.toBe(byLot.body[0].id)

    // The period is in calendar days of the database's clock.
    const [[day]] = (await sequelize.query('SELECT current_date::text AS today')) as [
      { today: string }[],
      unknown,
    ]
    const today = day!.today
    expect(
      Number(
        (await get(`lotNumber=${lot.lotNumber}&from=2000-01-01&to=2000-12-31`)).headers[
          'x-total-count'
        ],
      ),
    ).toBe(0)
    expect(
      Number(
        (await get(`lotNumber=${lot.lotNumber}&from=${today}&to=${today}`)).headers[
          'x-total-count'
        ],
      ),
    ).toBe(total)

    expect((await get('actorId=1', w.supervisor.auth)).status).toBe(403)
  })
})
