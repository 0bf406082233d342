import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import sharp from 'sharp'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { Photo } from '../../../server/db/models'
import { env } from '../../../server/config/env'
import { createCustomerAndSpec, lotBody, partBody, uuid } from './floorSupport'

const app = createApp()
let auth: string
let customerAuth: string
let lot: { id: number; lotNumber: string; parts: { id: number; heatNumber: string }[] }

/** CRC-32 as PNG chunks use it, to craft a header that lies about the image size. */
function crc32(buf: Buffer): number {
  let c = ~0
  for (const byte of buf) {
    c ^= byte
    for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1))
  }
  return ~c >>> 0
}

/** A tiny PNG whose header claims width × height pixels: a decompression bomb's signature. */
async function pngClaiming(width: number, height: number): Promise<Buffer> {
  const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#888' } })
    .png()
    .toBuffer()
  const out = Buffer.from(png)
  out.writeUInt32BE(width, 16)
  out.writeUInt32BE(height, 20)
  out.writeUInt32BE(crc32(out.subarray(12, 29)), 29)
  return out
}

const upload = (
  partId: number,
  file: Buffer,
  filename: string,
  caption = 'Holiday repair, flange face',
) =>
  request(app)
    .post(`/api/parts/${partId}/photos`)
    .set('Authorization', auth)
    .field('clientId', uuid())
    .field('caption', caption)
    .attach('file', file, filename)

beforeAll(async () => {
  auth = await tokenFor(app, await createUser('operator'))
  customerAuth = await tokenFor(app, await createUser('customer'))
  const { customer, spec } = await createCustomerAndSpec()
  const res = await request(app)
    .post('/api/lots')
    .set('Authorization', auth)
    .send(
      lotBody(customer.id, spec.id, {
        orderRef: 'PO-AWB-77120',
        parts: [partBody({ heatNumber: 'HT-58213-B' }), partBody()],
      }),
    )
  lot = res.body
})

describe('photos', () => {
  it('stores a JPEG with a thumbnail and serves both privately', async () => {
    const jpeg = await sharp({
      create: { width: 1200, height: 800, channels: 3, background: '#3a6' },
    })
      .jpeg()
      .toBuffer()
    const res = await upload(lot.parts[0]!.id, jpeg, '../../etc/passwd.jpg')
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      partId: lot.parts[0]!.id,
      width: 1200,
      height: 800,
      caption: 'Holiday repair, flange face',
    })
    const full = await request(app).get(`/api/photos/${res.body.id}`).set('Authorization', auth)
    expect(full.status).toBe(200)
    expect(full.headers['content-type']).toBe('image/jpeg')
    expect(full.headers['cache-control']).toMatch(/^private/)
    expect(Buffer.compare(full.body as Buffer, jpeg)).toBe(0)
    const thumb = await request(app)
      .get(`/api/photos/${res.body.id}/thumb`)
      .set('Authorization', auth)
    expect(thumb.headers['content-type']).toBe('image/webp')
    const meta = await sharp(thumb.body as Buffer).metadata()
    expect(Math.max(meta.width, meta.height)).toBe(320)
    const detail = await request(app).get(`/api/lots/${lot.id}`).set('Authorization', auth)
    expect(detail.body.photos.map((p: { id: number }) => p.id)).toContain(res.body.id)
    expect(
      (await request(app).get(`/api/photos/${res.body.id}`).set('Authorization', customerAuth))
        .status,
    ).toBe(403)
  })

  it('refuses a text file renamed .jpg, judged by its content', async () => {
    const res = await upload(
      lot.parts[0]!.id,
      Buffer.from('just some notes, not a photo\n'.repeat(20)),
      'photo.jpg',
    )
    expect(res.status).toBe(415)
    expect(res.body.error.message).toMatch(/not a JPEG, PNG, WebP or HEIC/)
  })

  it('refuses a file over the upload limit and a decompression bomb', async () => {
    const big = Buffer.alloc(env.UPLOAD_MAX_BYTES + 1, 0xff)
    const tooBig = await upload(lot.parts[0]!.id, big, 'big.jpg')
    expect(tooBig.status).toBe(413)
    expect(tooBig.body.error.code).toBe('too_large')
    const bomb = await upload(lot.parts[0]!.id, await pngClaiming(20000, 20000), 'bomb.png')
    expect(bomb.status).toBe(413)
    expect(bomb.body.error.message).toMatch(/400\.0 megapixels/)
    expect(await Photo.count({ where: { lotId: lot.id } })).toBe(1)
  })

  it('a lot-level photo naming a part of another lot is refused', async () => {
    const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#fff' } })
      .png()
      .toBuffer()
    const res = await request(app)
      .post(`/api/lots/${lot.id + 1000}/photos`)
      .set('Authorization', auth)
      .field('clientId', uuid())
      .field('partId', String(lot.parts[0]!.id))
      .attach('file', png, 'x.png')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('part_of_another_lot')
  })
})

describe('lot list', () => {
  it('finds the lot by part of a heat number, order ref or lot number', async () => {
    for (const q of ['58213', 'ht-58213', 'AWB-77120', lot.lotNumber]) {
      const res = await request(app).get('/api/lots').query({ q }).set('Authorization', auth)
      expect(res.status).toBe(200)
      expect(res.body.map((l: { id: number }) => l.id)).toContain(lot.id)
      expect(res.headers['x-total-count']).toBe(String(res.body.length))
    }
    const none = await request(app)
      .get('/api/lots')
      .query({ q: 'HT-00000-Z' })
      .set('Authorization', auth)
    expect(none.body).toEqual([])
  })

  it('filters by status and line and counts parts', async () => {
    const res = await request(app)
      .get('/api/lots')
      .query({ status: 'open', line: 'fbe-powder' })
      .set('Authorization', auth)
    const row = res.body.find((l: { id: number }) => l.id === lot.id)
    expect(row).toMatchObject({ partCount: 2, partsIncomplete: 2, partsPassed: 0, status: 'open' })
    const other = await request(app)
      .get('/api/lots')
      .query({ line: 'liquid-epoxy' })
      .set('Authorization', auth)
    expect(other.body.find((l: { id: number }) => l.id === lot.id)).toBeUndefined()
    expect((await request(app).get('/api/lots').set('Authorization', customerAuth)).status).toBe(
      403,
    )
  })
})
