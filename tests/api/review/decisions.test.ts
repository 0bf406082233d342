import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { LotDecision } from '../../../server/db/models'
import { updatePlantSettings } from '../../../server/api/settings/settings.service'
import { DEFAULT_SETTINGS } from '../../../shared/api/setup'
import {
  GOOD_SPOTS_UM,
  THIN_SPOTS_UM,
  decide,
  inspectedLot,
  lotVersion,
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

describe('submitting a lot for review', () => {
  it('refuses while a part is uninspected, naming the part', async () => {
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM, null])
    const res = await submit(app, w.operator, lot.id)
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('inspection_incomplete')
    expect(res.body.error.message).toContain('VB-2')
    expect(res.body.error.details.parts.map((p: { partId: number }) => p.partId)).toEqual([
      lot.partIds[1],
    ])
  })

  it('moves a fully inspected lot to awaiting review, once', async () => {
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    const res = await submit(app, w.operator, lot.id)
    expect(res.status).toBe(200)
    expect(res.body.lot.status).toBe('awaiting-review')
    expect(res.body.nonconformancesOpened).toEqual([])
    const again = await submit(app, w.operator, lot.id)
    expect(again.status).toBe(409)
    expect(again.body.error.message).toContain('already been submitted')
  })

  it('opens one nonconformance per failing criterion per part, typed thin film', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM, GOOD_SPOTS_UM, THIN_SPOTS_UM])
    const opened = lot.submitted.nonconformancesOpened
    expect(opened).toHaveLength(2)
    for (const nc of opened as unknown as {
      number: string
      criterion: string
      source: string
      defectLabel: string
      parts: { id: number }[]
    }[]) {
      // Our own scheme: NC-, ISO year and week, sequence.
      expect(nc.number).toMatch(/^NC-\d{4}-\d{3}$/)
      expect(nc.source).toBe('auto')
      expect(nc.criterion).toBe('thickness')
      expect(nc.defectLabel).toMatch(/^Thin film/)
    }
    expect(opened.map((n) => (n as unknown as { parts: { id: number }[] }).parts[0]!.id)).toEqual([
      lot.partIds[0],
      lot.partIds[2],
    ])
  })

  it('is for the floor: a manager may not submit', async () => {
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    const manager = await (await import('../support/fixtures')).createUser('manager')
    const auth = await (await import('../support/fixtures')).tokenFor(app, manager)
    const res = await request(app)
      .post(`/api/lots/${lot.id}/submit`)
      .set('Authorization', auth)
      .send({})
    expect(res.status).toBe(403)
  })
})

describe('the decision state machine', () => {
  it('awaiting review → released, then every further decision is refused; the answer says to reopen', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const res = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(res.status).toBe(201)
    expect(res.body.lot.status).toBe('released')
    expect(res.body.decision).toMatchObject({
      decision: 'release',
      independenceWaived: false,
      decided: { byId: w.supervisor.user.id },
    })
    for (const d of ['release', 'hold', 'reject']) {
      const again = await decide(app, w, w.supervisor, lot.id, d, 'second thoughts')
      expect(again.status).toBe(409)
      expect(again.body.error.code).toBe('transition_refused')
      expect(again.body.error.message).toContain('reopen the lot with a reason')
    }
  })

  it('awaiting review → on hold → released', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const hold = await decide(app, w, w.supervisor, lot.id, 'hold', 'Waiting for the DSC lab sheet')
    expect(hold.status).toBe(201)
    expect(hold.body.lot.status).toBe('on-hold')
    const holdAgain = await decide(app, w, w.supervisor, lot.id, 'hold', 'Still waiting')
    expect(holdAgain.status).toBe(409)
    const release = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(release.status).toBe(201)
    expect(release.body.lot.status).toBe('released')
    const list = await request(app)
      .get(`/api/lots/${lot.id}/decisions`)
      .set('Authorization', w.operator.auth)
    expect(list.body.map((d: { decision: string }) => d.decision)).toEqual(['hold', 'release'])
  })

  it('on hold → rejected, and a rejection is final (no decision, no reopen)', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'hold', 'Suspected contamination')
    const reject = await decide(app, w, w.supervisor, lot.id, 'reject', 'Contamination confirmed')
    expect(reject.status).toBe(201)
    expect(reject.body.lot.status).toBe('rejected')
    const release = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(release.status).toBe(409)
    expect(release.body.error.message).toContain('final')
    const reopen = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Try again', version: await lotVersion(app, w, lot.id) })
    expect(reopen.status).toBe(409)
  })

  it('awaiting review → rejected directly', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const res = await decide(app, w, w.supervisor, lot.id, 'reject', 'Wrong powder applied')
    expect(res.status).toBe(201)
    expect(res.body.lot.status).toBe('rejected')
  })

  it('an open lot cannot be decided', async () => {
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    const res = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(res.status).toBe(409)
    expect(res.body.error.message).toContain('still open')
  })

  it('hold and reject need a reason (400 naming the field)', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    for (const d of ['hold', 'reject']) {
      const res = await decide(app, w, w.supervisor, lot.id, d, '')
      expect(res.status).toBe(400)
      expect(res.body.error.details[0].field).toBe('body.reason')
    }
  })

  it('only QA decides: an operator gets 403', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const res = await decide(app, w, w.operator, lot.id, 'release')
    expect(res.status).toBe(403)
  })

  it('a decision row can never be changed or deleted, even in raw SQL', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, lot.id, 'hold', 'Checking')
    const { sequelize } = await import('../../../server/db')
    await expect(
      sequelize.query(`UPDATE lot_decisions SET reason = 'nothing' WHERE lot_id = ${lot.id}`),
    ).rejects.toThrow(/append-only/)
    await expect(
      sequelize.query(`DELETE FROM lot_decisions WHERE lot_id = ${lot.id}`),
    ).rejects.toThrow(/append-only/)
    expect(await LotDecision.count({ where: { lotId: lot.id } })).toBe(1)
  })
})

describe('release blocked', () => {
  it('by an open nonconformance, listing it and the failing part in details', async () => {
    const lot = await submittedLot(app, w, [THIN_SPOTS_UM, GOOD_SPOTS_UM])
    const nc = lot.submitted.nonconformancesOpened[0]!
    const res = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('release_blocked')
    const blockers = res.body.error.details.blockers as {
      kind: string
      number?: string
      partId?: number
      criterion?: string
    }[]
    expect(blockers).toContainEqual(
      expect.objectContaining({ kind: 'nonconformance', number: nc.number, status: 'open' }),
    )
    expect(blockers).toContainEqual(
      expect.objectContaining({
        kind: 'part',
        partId: lot.partIds[0],
        criterion: 'thickness',
        status: 'fail',
      }),
    )
    expect(blockers.some((b) => b.partId === lot.partIds[1])).toBe(false)
  })
})

describe('independence of the releaser', () => {
  it('refuses a supervisor who recorded readings of the lot, and allows it with the plant setting, flagged', async () => {
    // The supervisor inspects the lot themselves.
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM], w.supervisor)
    expect((await submit(app, w.supervisor, lot.id)).status).toBe(200)
    const queue = await request(app)
      .get('/api/review/queue')
      .set('Authorization', w.supervisor2.auth)
    expect(queue.body.find((q: { id: number }) => q.id === lot.id).recorderIds).toEqual([
      w.supervisor.user.id,
    ])

    const refused = await decide(app, w, w.supervisor, lot.id, 'release')
    expect(refused.status).toBe(403)
    expect(refused.body.error.code).toBe('not_independent')

    await updatePlantSettings(w.admin.user, { ...DEFAULT_SETTINGS, allowRecorderToRelease: true })
    try {
      const allowed = await decide(app, w, w.supervisor, lot.id, 'release')
      expect(allowed.status).toBe(201)
      expect(allowed.body.decision.independenceWaived).toBe(true)
      const row = await LotDecision.findOne({ where: { lotId: lot.id } })
      expect(row!.independenceWaived).toBe(true)
    } finally {
      await updatePlantSettings(w.admin.user, {
        ...DEFAULT_SETTINGS,
        allowRecorderToRelease: false,
      })
    }
  })

  it('another supervisor releases without a waiver', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const res = await decide(app, w, w.supervisor2, lot.id, 'release')
    expect(res.status).toBe(201)
    expect(res.body.decision.independenceWaived).toBe(false)
  })
})

describe('two supervisors at once', () => {
  it('exactly one decision stands; the other gets 409 with the current lot', async () => {
    const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const version = await lotVersion(app, w, lot.id)
    const send = (by: typeof w.supervisor, decision: string, reason: string) =>
      request(app)
        .post(`/api/lots/${lot.id}/decisions`)
        .set('Authorization', by.auth)
        .send({ decision, reason, version })
    const [a, b] = await Promise.all([
      send(w.supervisor, 'release', ''),
      send(w.supervisor2, 'hold', 'Recheck the holiday log'),
    ])
    const statuses = [a.status, b.status].sort()
    expect(statuses).toEqual([201, 409])
    const loser = a.status === 409 ? a : b
    const winner = a.status === 201 ? a : b
    expect(loser.body.error.code).toBe('version_conflict')
    expect(loser.body.error.details.current.status).toBe(winner.body.lot.status)
    expect(loser.body.error.details.current.version).toBe(version + 1)
    expect(await LotDecision.count({ where: { lotId: lot.id } })).toBe(1)
  })
})
