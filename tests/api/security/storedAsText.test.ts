import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { DefectType } from '../../../server/db/models'
import { lotBody, partBody } from '../floor/floorSupport'
import { reviewWorld, type ReviewWorld } from '../review/reviewSupport'
import { SCRIPT, SQL } from './badInputEngine'

/**
 * Free text that looks like markup or SQL is a valid note, name or description: it is stored as
 * typed and answered as JSON text, never as HTML. The client shows it with Vue text
 * interpolation, which escapes it (the browser journeys look at a lot note and a customer name).
 */
const app = createApp()
const HOSTILE_TEXT = `${SCRIPT} ${SQL} <img src=x onerror=alert(2)> & "quotes"`

function expectJsonText(res: request.Response) {
  expect(res.headers['content-type']).toMatch(/^application\/json/)
  expect(res.headers['x-content-type-options']).toBe('nosniff')
  // JSON.stringify leaves < and > alone: the raw answer holds the text exactly, not HTML entities.
  expect(res.text).not.toMatch(/&lt;|&gt;|&amp;|&quot;/)
}

describe('script- and SQL-shaped text is stored verbatim and answered as JSON', () => {
  let w: ReviewWorld
  let admin: string
  beforeAll(async () => {
    w = await reviewWorld(app)
    admin = w.admin.auth
  })

  it('a customer name and address', async () => {
    const made = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ name: HOSTILE_TEXT.slice(0, 200), code: 'XSS-1', address: HOSTILE_TEXT })
    expect(made.status).toBe(201)
    const read = await request(app)
      .get(`/api/customers/${made.body.id}`)
      .set('Authorization', admin)
    expect(read.status).toBe(200)
    expectJsonText(read)
    expect(read.body.name).toBe(HOSTILE_TEXT.slice(0, 200).trim())
    expect(read.body.address).toBe(HOSTILE_TEXT)
  })

  it('a lot note, a part description, a section note and a nonconformance description', async () => {
    const lot = await request(app)
      .post('/api/lots')
      .set('Authorization', w.operator.auth)
      .send(
        lotBody(w.customerId, w.specId, {
          notes: HOSTILE_TEXT,
          parts: [partBody({ description: HOSTILE_TEXT })],
        }),
      )
    expect(lot.status).toBe(201)
    const partId = lot.body.parts[0].id as number
    const note = await request(app)
      .put(`/api/parts/${partId}/sections/notes`)
      .set('Authorization', w.operator.auth)
      .send({ clientId: crypto.randomUUID(), data: { text: HOSTILE_TEXT } })
    expect(note.status).toBeLessThan(300)
    const type = await DefectType.create({ code: 'xss-run', label: 'Run' })
    const nc = await request(app)
      .post('/api/nonconformances')
      .set('Authorization', w.supervisor.auth)
      .send({
        lotId: lot.body.id,
        partIds: [partId],
        defectTypeId: type.id,
        description: HOSTILE_TEXT,
      })
    expect(nc.status).toBe(201)

    const readLot = await request(app).get(`/api/lots/${lot.body.id}`).set('Authorization', admin)
    expectJsonText(readLot)
    expect(readLot.body.notes).toBe(HOSTILE_TEXT)
    expect(readLot.body.parts[0].description).toBe(HOSTILE_TEXT)
    const readPart = await request(app).get(`/api/parts/${partId}`).set('Authorization', admin)
    expectJsonText(readPart)
    expect(readPart.body.sections.notes.data.text).toBe(HOSTILE_TEXT)
    const readNc = await request(app)
      .get(`/api/nonconformances/${nc.body.id}`)
      .set('Authorization', admin)
    expectJsonText(readNc)
    expect(readNc.body.description).toBe(HOSTILE_TEXT)
  })

  it('a search for SQL-shaped text is a search, not SQL', async () => {
    const res = await request(app)
      .get(`/api/lots?q=${encodeURIComponent(SQL)}`)
      .set('Authorization', admin)
    expect(res.status).toBe(200)
    expect(res.body).toEqual([])
    const all = await request(app).get('/api/lots').set('Authorization', admin)
    expect(all.body.length).toBeGreaterThan(0)
  })
})
