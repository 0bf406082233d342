import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { existsSync, readdirSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { resolve } from 'node:path'
import type { Express } from 'express'
import { decompressionBombPng, noisePng, truncatedPng } from './hostileImages'

/**
 * Photo uploads fed what a careless or hostile client sends. UPLOAD_MAX_BYTES is read once at
 * import: set small for this file, then the app is imported (static imports would be hoisted).
 */
const MAX_BYTES = 512 * 1024
process.env.UPLOAD_MAX_BYTES = String(MAX_BYTES)
const { createApp } = await import('../../../server/app')
const { Photo } = await import('../../../server/db/models')
const { sequelize } = await import('../../../server/db')
const { GOOD_SPOTS_UM, inspectedLot, reviewWorld, uuid } = await import('../review/reviewSupport')
const { smallPng } = await import('./securityWorld')

const ROOT = resolve(new URL('../../../', import.meta.url).pathname)
/** Every place a careless upload handler might write: the uploads folder, the repo, the temp dir. */
const WATCHED = [resolve(ROOT, 'uploads'), ROOT, tmpdir()]
const listing = () => WATCHED.map((d) => (existsSync(d) ? readdirSync(d).sort() : []))

describe('photo uploads refuse what is not a photo, and store nothing of it', () => {
  let app: Express
  let auth: string
  let partId: number
  let lotId: number
  beforeAll(async () => {
    app = createApp()
    const w = await reviewWorld(app)
    const lot = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    partId = lot.partIds[0]!
    lotId = lot.id
    auth = w.operator.auth
  })

  const upload = (path: string, file: Buffer, filename: string, contentType = 'image/jpeg') =>
    request(app)
      .post(path)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .attach('file', file, { filename, contentType })

  async function refused(
    file: Buffer,
    filename: string,
    status: number,
    code: string,
    message: RegExp,
  ) {
    const before = { rows: await Photo.count(), files: listing() }
    for (const path of [`/api/parts/${partId}/photos`, `/api/lots/${lotId}/photos`]) {
      const res = await upload(path, file, filename)
      expect({ path, status: res.status, code: res.body.error?.code }).toEqual({
        path,
        status,
        code,
      })
      expect(res.body.error.message).toMatch(message)
    }
    expect({ rows: await Photo.count(), files: listing() }).toEqual(before)
  }

  it('a text file named .jpg: its content is checked, not its name', async () => {
    await refused(
      Buffer.from('just some notes, not a photo\n'.repeat(40)),
      'flange.jpg',
      415,
      'unsupported_image',
      /not a JPEG, PNG, WebP or HEIC photo/,
    )
  })

  it('an SVG with a script in it, named .png', async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'
    await refused(Buffer.from(svg), 'flange.png', 415, 'unsupported_image', /content was checked/)
  })

  it('an HTML page named .jpeg', async () => {
    await refused(
      Buffer.from('<!doctype html><script>alert(1)</script>'),
      'a.jpeg',
      415,
      'unsupported_image',
      /photo/,
    )
  })

  it('a PNG cut off half-way', async () => {
    await refused(await truncatedPng(), 'cut.png', 415, 'unreadable_image', /damaged/)
  })

  it(`a real photo over UPLOAD_MAX_BYTES (${MAX_BYTES / 1024} KB)`, async () => {
    const big = await noisePng(480)
    expect(big.length).toBeGreaterThan(MAX_BYTES)
    await refused(
      big,
      'big.png',
      413,
      'too_large',
      /larger than 0\.5 MB: take it at a lower resolution/,
    )
  })

  it('a decompression bomb: 20000 × 20000 px in a few KB', async () => {
    const bomb = decompressionBombPng()
    expect(bomb.length).toBeLessThan(MAX_BYTES)
    const rssBefore = process.memoryUsage().rss
    await refused(
      bomb,
      'bomb.png',
      413,
      'image_too_large',
      /20000 × 20000 pixels \(400\.0 megapixels\); at most 40 megapixels/,
    )
    // Refused from the header: the 1.2 GB of pixels were never decoded.
    expect(process.memoryUsage().rss - rssBefore).toBeLessThan(300 * 1024 * 1024)
  })

  it('a caption holding a NUL: refused by name, nothing stored', async () => {
    const before = await Photo.count()
    const res = await request(app)
      .post(`/api/parts/${partId}/photos`)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .field('caption', 'Holiday at the\u0000flange')
      .attach('file', await smallPng(), 'flange.png')
    expect({ status: res.status, field: res.body.error?.details?.[0]?.field }).toEqual({
      status: 400,
      field: 'body.caption',
    })
    expect(await Photo.count()).toBe(before)
  })

  it('two files, or the file under another field name', async () => {
    const png = await smallPng()
    const before = await Photo.count()
    const two = await request(app)
      .post(`/api/parts/${partId}/photos`)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .attach('file', png, 'a.png')
      .attach('file', png, 'b.png')
    expect(two.status).toBe(400)
    expect(two.body.error.code).toBe('invalid_upload')
    const elsewhere = await request(app)
      .post(`/api/parts/${partId}/photos`)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .attach('photo', png, 'a.png')
    expect(elsewhere.status).toBe(400)
    expect(elsewhere.body.error.message).toMatch(/"file" field/)
    expect(await Photo.count()).toBe(before)
  })

  it('a path-traversal file name: the photo is kept, under no name of its own, nowhere on disk', async () => {
    const before = listing()
    const name = '../../etc/passwd.jpg'
    const caption = '<script>alert(1)</script>'
    const res = await request(app)
      .post(`/api/parts/${partId}/photos`)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .field('caption', caption)
      .attach('file', await smallPng(), { filename: name, contentType: 'image/png' })
    expect(res.status).toBe(201)
    expect(res.text).not.toContain('passwd')
    expect(res.body.caption).toBe(caption)
    expect(listing()).toEqual(before)
    for (const p of ['/etc/passwd.jpg', resolve(ROOT, 'uploads', name), resolve(ROOT, name)]) {
      expect(existsSync(p), p).toBe(false)
    }
    // The table has no column for the client's file name at all.
    const [columns] = await sequelize.query(
      "SELECT column_name FROM information_schema.columns WHERE table_name = 'photos'",
    )
    const names = (columns as { column_name: string }[]).map((c) => c.column_name)
    expect(names).toContain('data')
    expect(names.filter((c) => /file|name|path/.test(c))).toEqual([])
    const [row] = await sequelize.query('SELECT * FROM photos WHERE id = $1', {
      bind: [res.body.id],
    })
    expect(JSON.stringify(row)).not.toContain('passwd')
    // Served back under a name the server makes, typed by the checked content.
    const bytes = await request(app).get(`/api/photos/${res.body.id}`).set('Authorization', auth)
    expect(bytes.status).toBe(200)
    expect(bytes.headers['content-type']).toBe('image/png')
    expect(bytes.headers['content-disposition']).toBe(`inline; filename="photo-${res.body.id}"`)
    expect(bytes.headers['x-content-type-options']).toBe('nosniff')
  })
})
