import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { inTransaction } from '../../../server/db'
import { Customer, User } from '../../../server/db/models'
import { getSpecVersion, lockSpecVersion } from '../../../server/api/specs/specs.service'
import { auditFor, fbeContent, fieldsOf } from './setupFixtures'

const app = createApp()

describe('Setup → Coating specs, versioned', () => {
  let adminUser: User
  let admin: string
  let operator: string
  beforeAll(async () => {
    adminUser = await createUser('admin')
    admin = await tokenFor(app, adminUser)
    operator = await tokenFor(app, await createUser('operator'))
  })

  it('edits in place while no lot uses a version; once locked, a change makes version 2 and version 1 stays as it was', async () => {
    const created = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({ code: 'FBE-VF-01', title: 'FBE on valves', content: fbeContent() })
    expect(created.status).toBe(201)
    const id = created.body.id as number
    expect(created.body).toMatchObject({ code: 'FBE-VF-01', currentVersion: 1, customerId: null })
    expect(created.body.versions).toHaveLength(1)
    expect(created.body.current).toMatchObject({
      version: 1,
      lockedAt: null,
      createdByName: adminUser.name,
    })
    // Defaults of the content schema filled in: PA 2 level 3 when none is named (PA 2 §9) [M].
    expect(created.body.current.content.thickness.pa2Level).toBe(3)

    // 1. Unlocked: the edit replaces version 1's content, no version 2.
    const tighter = fbeContent({
      thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 355.6, maxUm: 508, pa2Level: 3 },
    })
    const edited = await request(app)
      .put(`/api/specs/${id}`)
      .set('Authorization', admin)
      .send({ content: tighter, changeNote: 'Minimum 14 mils' })
    expect(edited.status).toBe(200)
    expect(edited.body.currentVersion).toBe(1)
    expect(edited.body.versions).toHaveLength(1)
    expect(edited.body.current.content.thickness.minUm).toBe(355.6)
    const inPlace = (await auditFor('coating-spec', id)).at(-1)!
    expect(inPlace.action).toBe('spec.edit-in-place')
    expect(inPlace.before).toMatchObject({
      version: { version: 1, content: { thickness: { minUm: 304.8 } } },
    })
    expect(inPlace.after).toMatchObject({
      version: { version: 1, content: { thickness: { minUm: 355.6 } } },
    })

    // 2. A lot is inspected against version 1 (the lots feature calls this in its transaction).
    const locked = await inTransaction((t) => lockSpecVersion(id, 1, t, adminUser))
    expect(locked.lockedAt).toBeInstanceOf(Date)
    const lockedAgain = await inTransaction((t) => lockSpecVersion(id, 1, t))
    expect(lockedAgain.lockedAt!.getTime()).toBe(locked.lockedAt!.getTime())

    // 3. Now a change becomes version 2; version 1 is still readable and unchanged.
    const wider = fbeContent({
      thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 355.6, maxUm: 609.6, pa2Level: 3 },
    })
    const v2 = await request(app)
      .put(`/api/specs/${id}`)
      .set('Authorization', admin)
      .send({ title: 'FBE on valves and fittings', content: wider, changeNote: 'Maximum 24 mils' })
    expect(v2.status).toBe(200)
    expect(v2.body).toMatchObject({ currentVersion: 2, title: 'FBE on valves and fittings' })
    expect(v2.body.current).toMatchObject({
      version: 2,
      lockedAt: null,
      changeNote: 'Maximum 24 mils',
    })
    expect(v2.body.versions.map((v: { version: number }) => v.version)).toEqual([1, 2])

    const v1 = await request(app).get(`/api/specs/${id}/versions/1`).set('Authorization', operator)
    expect(v1.status).toBe(200)
    expect(v1.body.content.thickness).toMatchObject({ minUm: 355.6, maxUm: 508 })
    expect(v1.body.lockedAt).not.toBeNull()
    expect((await getSpecVersion(id, 1)).content.thickness.maxUm).toBe(508)
    expect((await getSpecVersion(id, 2)).content.thickness.maxUm).toBe(609.6)
    expect((await auditFor('coating-spec', id)).at(-1)!.action).toBe('spec.new-version')
    expect((await auditFor('spec-version', locked.id)).map((e) => e.action)).toEqual([
      'spec-version.lock',
    ])

    // 4. The same content again on a locked version 2 would not make an empty version 3.
    await inTransaction((t) => lockSpecVersion(id, 2, t))
    const same = await request(app)
      .put(`/api/specs/${id}`)
      .set('Authorization', admin)
      .send({ content: wider })
    expect(same.body.currentVersion).toBe(2)

    const detail = await request(app).get(`/api/specs/${id}`).set('Authorization', operator)
    expect(detail.status).toBe(200)
    expect(detail.body.versions).toHaveLength(2)
    const list = await request(app).get('/api/specs').set('Authorization', operator)
    const row = list.body.find((s: { id: number }) => s.id === id)
    expect(row).toMatchObject({ currentVersion: 2, current: { version: 2 } })
  })

  it('names the field of a content that does not hold together (400)', async () => {
    const upsideDown = fbeContent({ thickness: { rule: 'SSPC-PA2', minUm: 508, maxUm: 304.8 } })
    const res = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({ code: 'BAD-1', title: 'Bad', content: upsideDown })
    expect(res.status).toBe(400)
    expect(fieldsOf(res.body)).toContain('body.content.thickness.maxUm')
    const noGrade = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({
        code: 'BAD-2',
        title: 'Bad',
        content: fbeContent({ surfacePrep: { grade: 'Sa 2½' } as never }),
      })
    expect(fieldsOf(noGrade.body)).toContain('body.content.surfacePrep.grade')
  })

  it('refuses a duplicate code (409) and an unknown customer (400); a customer spec shows its customer', async () => {
    const body = { code: 'DUP-1', title: 'Dup', content: fbeContent() }
    expect(
      (await request(app).post('/api/specs').set('Authorization', admin).send(body)).status,
    ).toBe(201)
    const dup = await request(app).post('/api/specs').set('Authorization', admin).send(body)
    expect(dup.status).toBe(409)
    expect(dup.body.error.message).toContain('DUP-1')
    const unknown = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({ ...body, code: 'X-1', customerId: 999999 })
    expect(unknown.status).toBe(400)
    expect(fieldsOf(unknown.body)).toContain('body.customerId')
    const company = await Customer.create({ name: 'Glenholm Water', code: 'GLW' })
    const own = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({ ...body, code: 'GLW-1', customerId: company.id })
    expect(own.body).toMatchObject({ customerId: company.id, customerName: 'Glenholm Water' })
  })

  it('answers 404 for a spec or a version that does not exist', async () => {
    expect(
      (await request(app).get('/api/specs/999999').set('Authorization', operator)).status,
    ).toBe(404)
    const created = await request(app)
      .post('/api/specs')
      .set('Authorization', admin)
      .send({ code: 'ONE-V', title: 'One', content: fbeContent() })
    expect(
      (
        await request(app)
          .get(`/api/specs/${created.body.id}/versions/7`)
          .set('Authorization', operator)
      ).status,
    ).toBe(404)
    await expect(
      inTransaction((t) => lockSpecVersion(created.body.id, 7, t)),
    ).rejects.toMatchObject({ status: 404 })
  })
})
