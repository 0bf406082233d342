import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { runSeed } from '../../../server/db/seeders'
import { DEFAULT_DEFECT_TYPES } from '../../../server/api/defect-types/defaultDefectTypes'
import { createUser, tokenFor } from '../support/fixtures'
import type { NonconformanceRow } from '../../../shared/api/review'

const app = createApp()
let auth: string

const q = <T extends object>(sql: string) => sequelize.query<T>(sql, { type: QueryTypes.SELECT })

beforeAll(async () => {
  await runSeed()
  auth = await tokenFor(app, await createUser('supervisor'))
}, 90000)

describe('demo review history', () => {
  it('seeds the defect type list once', async () => {
    const types = await q<{ code: string }>('SELECT code FROM defect_types ORDER BY id')
    for (const d of DEFAULT_DEFECT_TYPES) expect(types.map((t) => t.code)).toContain(d.code)
    const again = await runSeed()
    expect(again.tally['defect types']).toEqual({ created: 0, kept: DEFAULT_DEFECT_TYPES.length })
    expect(again.skipped).toContain('review-history')
  })

  it('every released lot has its submission and release; repaired parts have a closed repair nonconformance', async () => {
    const [r] = await q<{
      released: number
      withRelease: number
      repaired: number
      covered: number
    }>(
      `SELECT count(*)::int AS released,
              count(*) FILTER (WHERE EXISTS (SELECT 1 FROM lot_decisions d WHERE d.lot_id = l.id AND d.decision = 'release')
                                 AND EXISTS (SELECT 1 FROM lot_submissions s WHERE s.lot_id = l.id))::int AS "withRelease",
              (SELECT count(*)::int FROM parts p JOIN lots x ON x.id = p.lot_id
                WHERE x.status = 'released' AND p.first_pass_status = 'fail') AS repaired,
              (SELECT count(DISTINCT p.id)::int FROM parts p JOIN lots x ON x.id = p.lot_id
                 JOIN nonconformance_parts np ON np.part_id = p.id JOIN nonconformances n ON n.id = np.nonconformance_id
                WHERE x.status = 'released' AND p.first_pass_status = 'fail' AND n.status = 'closed'
                  AND n.disposition = 'repair-retest' AND np.retest_round = p.round) AS covered
         FROM lots l WHERE l.status = 'released'`,
    )
    expect(r!.released).toBeGreaterThan(50)
    expect(r!.withRelease).toBe(r!.released)
    expect(r!.repaired).toBeGreaterThan(0)
    expect(r!.covered).toBe(r!.repaired)
  })

  it("a repaired lot's history tells the story in order", async () => {
    const [lot] = await q<{ id: number }>(
      `SELECT l.id FROM lots l WHERE EXISTS (SELECT 1 FROM lot_decisions d WHERE d.lot_id = l.id AND d.decision = 'hold') ORDER BY l.id LIMIT 1`,
    )
    const res = await request(app).get(`/api/lots/${lot!.id}/history`).set('Authorization', auth)
    const actions = (res.body as { action: string }[])
      .map((e) => e.action)
      .filter((a) => a !== 'part.create')
    // lot.open comes from the floor seed, dated when the seed runs; the review story keeps its own dates.
    expect(actions).toContain('lot.open')
    const order = [
      'lot.submit',
      'nonconformance.open',
      'lot.hold',
      'nonconformance.close',
      'lot.release',
    ]
    const positions = order.map((a) => actions.indexOf(a))
    expect(positions.every((p) => p >= 0)).toBe(true)
    expect([...positions].sort((a, b) => a - b)).toEqual(positions)
  })

  it('a supervisor can work the queue to empty', async () => {
    const queue = (await request(app).get('/api/review/queue').set('Authorization', auth)).body as {
      id: number
      version: number
    }[]
    expect(queue.length).toBeGreaterThanOrEqual(2)
    let concession = 0
    for (const lot of queue) {
      const ncs = (
        await request(app).get(`/api/nonconformances?lotId=${lot.id}`).set('Authorization', auth)
      ).body as NonconformanceRow[]
      for (const nc of ncs.filter((n) => n.status !== 'closed')) {
        concession += 1
        const ref = `CON-DEMO-${concession}`
        const disp = await request(app)
          .post(`/api/nonconformances/${nc.id}/disposition`)
          .set('Authorization', auth)
          .send({ disposition: 'use-as-is', concessionRef: ref, version: nc.version })
        expect(disp.status).toBe(200)
        const closed = await request(app)
          .post(`/api/nonconformances/${nc.id}/close`)
          .set('Authorization', auth)
          .send({
            verification: `Concession ${ref} signed by the buyer`,
            version: disp.body.version,
          })
        expect(closed.status).toBe(200)
      }
      const release = await request(app)
        .post(`/api/lots/${lot.id}/decisions`)
        .set('Authorization', auth)
        .send({ decision: 'release', version: lot.version })
      expect(release.status, JSON.stringify(release.body)).toBe(201)
    }
    expect(concession).toBeGreaterThan(0)
    const after = (await request(app).get('/api/review/queue').set('Authorization', auth))
      .body as unknown[]
    expect(after).toEqual([])
  })
})
