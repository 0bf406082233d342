import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { Lot } from '../../../server/db/models'
import { unstorableField } from '../../../server/middleware/storableText'
import { lotBody } from '../floor/floorSupport'
import { reviewWorld, type ReviewWorld } from '../review/reviewSupport'

/**
 * Text PostgreSQL cannot hold: a NUL (its text and jsonb types refuse U+0000, PostgreSQL manual
 * §8.3 and §8.14, section numbers from memory; the 500s the bad-input suite saw before the fix
 * confirm it) and half of a UTF-16 surrogate pair (UTF-8 may not encode U+D800–U+DFFF, RFC 3629
 * §3, from memory). A JSON body can carry either only as a \u escape. The server answers 400
 * naming the field, before anything is written; it was a 500 halfway through a transaction. A
 * whole pair (an emoji) is text.
 */
const app = createApp()

/** The body's JSON text with `marker` replaced by a raw escape such as \u0000. */
function withEscape(body: object, marker: string, escape: string) {
  return JSON.stringify(body).replace(marker, escape)
}

describe('text that cannot be stored is refused by name; whole characters are kept', () => {
  let w: ReviewWorld
  beforeAll(async () => {
    w = await reviewWorld(app)
  })

  const post = (text: string) =>
    request(app)
      .post('/api/lots')
      .set('Authorization', w.operator.auth)
      .set('Content-Type', 'application/json')
      .send(text)

  for (const [what, escape] of [
    ['a NUL', '\\u0000'],
    ['a lone high surrogate', '\\ud83d'],
    ['a lone low surrogate', '\\udc4d'],
  ] as const) {
    it(`${what} in a lot's notes: 400 naming body.notes, no lot made`, async () => {
      const before = await Lot.count()
      const body = lotBody(w.customerId, w.specId, { notes: 'Batch MARK checked' })
      const res = await post(withEscape(body, 'MARK', escape))
      expect(res.status).toBe(400)
      expect(res.body.error.code).toBe('invalid_input')
      expect(res.body.error.message).toMatch(/^body\.notes: .*cannot be stored/)
      expect(await Lot.count()).toBe(before)
    })
  }

  it('an emoji written as an escaped surrogate pair is stored and read back whole', async () => {
    const body = lotBody(w.customerId, w.specId, { notes: 'Batch MARK checked' })
    const res = await post(withEscape(body, 'MARK', '\\ud83d\\udc4d'))
    expect(res.status).toBe(201)
    const read = await request(app)
      .get(`/api/lots/${res.body.id}`)
      .set('Authorization', w.operator.auth)
    expect(read.body.notes).toBe('Batch 👍 checked')
  })

  it('%00 in the address of a search: 400, not a database error', async () => {
    const res = await request(app).get('/api/lots?q=VB%00150').set('Authorization', w.operator.auth)
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
  })

  it('a NUL in a key is found too, at any depth', () => {
    expect(unstorableField({ content: { notes: 'ok', ['bad\u0000key']: 1 } }, 'body')).toBe(
      'body.content.bad\u0000key',
    )
    expect(unstorableField({ readings: [{ note: 'a\u0000' }] }, 'body')).toBe(
      'body.readings.0.note',
    )
    expect(unstorableField({ readings: [{ note: 'a 👍' }], n: 3, x: null }, 'body')).toBeNull()
  })
})
