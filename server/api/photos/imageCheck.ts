import sharp, { type Metadata } from 'sharp'
import { HttpError } from '../../lib/httpError'
import type { PhotoMime } from '../../db/models/Photo'

/** More pixels than any tablet camera makes: beyond this it is a decompression bomb, not a photo. */
export const MAX_PHOTO_PIXELS = 40_000_000
export const THUMB_EDGE_PX = 320

export interface CheckedImage {
  mime: PhotoMime
  width: number
  height: number
  thumb: Buffer
}

const notAnImage = () =>
  new HttpError(
    415,
    'unsupported_image',
    'The file is not a JPEG, PNG, WebP or HEIC photo (its content was checked, not its name)',
  )

/**
 * The type comes from the bytes (sharp reads the header), never from the file name or the
 * browser's claimed type. The thumbnail is decoded with the same pixel limit, so a crafted file
 * that lies in its header still cannot exhaust memory.
 */
export async function checkImage(data: Buffer): Promise<CheckedImage> {
  const options = { limitInputPixels: MAX_PHOTO_PIXELS, failOn: 'error' as const }
  let meta: Metadata
  try {
    // The header alone (no pixels decoded), read without the limit so the answer can name the size.
    meta = await sharp(data, { limitInputPixels: false, failOn: 'error' }).metadata()
  } catch {
    throw notAnImage()
  }
  let mime: PhotoMime
  if (meta.format === 'jpeg') mime = 'image/jpeg'
  else if (meta.format === 'png') mime = 'image/png'
  else if (meta.format === 'webp') mime = 'image/webp'
  else if (meta.format === 'heif' && meta.compression === 'hevc') mime = 'image/heic'
  else throw notAnImage()
  const pixels = meta.width * meta.height
  if (!(pixels > 0)) throw notAnImage()
  if (pixels > MAX_PHOTO_PIXELS) {
    throw new HttpError(
      413,
      'image_too_large',
      `The photo is ${meta.width} × ${meta.height} pixels (${(pixels / 1e6).toFixed(1)} megapixels); at most ${MAX_PHOTO_PIXELS / 1e6} megapixels are accepted`,
    )
  }
  let thumb: Buffer
  try {
    thumb = await sharp(data, options)
      .autoOrient()
      .resize({
        width: THUMB_EDGE_PX,
        height: THUMB_EDGE_PX,
        fit: 'inside',
        withoutEnlargement: true,
      })
      .webp({ quality: 75 })
      .toBuffer()
  } catch {
    throw new HttpError(
      415,
      'unreadable_image',
      mime === 'image/heic'
        ? 'This HEIC photo cannot be decoded here: set the tablet camera to JPEG ("most compatible") and take it again'
        : 'The photo is damaged and cannot be decoded',
    )
  }
  const { width, height } = meta.autoOrient ?? meta
  return { mime, width, height, thumb }
}
