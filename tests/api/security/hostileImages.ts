import { crc32, deflateSync } from 'node:zlib'
import sharp from 'sharp'

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4)
  length.writeUInt32BE(data.length)
  const typed = Buffer.concat([Buffer.from(type, 'ascii'), data])
  const crc = Buffer.alloc(4)
  crc.writeUInt32BE(crc32(typed))
  return Buffer.concat([length, typed, crc])
}

/**
 * A decompression bomb: a valid 1-bit greyscale PNG of one colour, widthPx × heightPx, whose
 * zlib stream compresses ~1000:1. 20000 × 20000 px (400 megapixels, 1.2 GB once decoded to RGB)
 * is about 50 KB on the wire. Built by hand: sharp would have to hold the whole image to make it.
 */
export function decompressionBombPng(widthPx = 20000, heightPx = 20000): Buffer {
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(widthPx, 0)
  ihdr.writeUInt32BE(heightPx, 4)
  ihdr[8] = 1 // bit depth
  ihdr[9] = 0 // greyscale
  // compression 0, filter 0, no interlace: the remaining bytes stay 0
  const row = Buffer.alloc(1 + Math.ceil(widthPx / 8)) // filter byte 0, then black pixels
  const raw = Buffer.alloc(row.length * heightPx) // all zero: every row is that row
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ])
}

/** Noise does not compress: a real PNG of about widthPx² × 3 bytes. */
export function noisePng(widthPx: number): Promise<Buffer> {
  const pixels = Buffer.alloc(widthPx * widthPx * 3)
  for (let i = 0; i < pixels.length; i++) pixels[i] = (i * 2654435761) >>> 24
  return sharp(pixels, { raw: { width: widthPx, height: widthPx, channels: 3 } })
    .png({ compressionLevel: 0 })
    .toBuffer()
}

/** A PNG whose header is right and whose pixel data is cut off half-way. */
export async function truncatedPng(): Promise<Buffer> {
  const whole = await noisePng(64)
  return whole.subarray(0, Math.floor(whole.length / 2))
}
