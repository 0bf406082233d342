import type { Request, Response } from 'express'
import multer from 'multer'
import { z } from 'zod'
import { inTransaction } from '../../db'
import { Lot, Part, Photo, User } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { HttpError, notFound } from '../../lib/httpError'
import { env } from '../../config/env'
import type { PhotoRow } from '../../../shared/api/lots'
import { assertLotOpen } from '../lots/lotGuards'
import { checkImage } from './imageCheck'
import { assertStorableText } from '../../middleware/storableText'

/** Kept in memory (never on disk, never under the uploaded name) until it is in PostgreSQL. */
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: env.UPLOAD_MAX_BYTES, files: 1, fields: 10, fieldSize: 8 * 1024, parts: 12 },
}).single('file')

function receive(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (!err) return resolve()
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const mb = (env.UPLOAD_MAX_BYTES / 1024 / 1024).toFixed(1)
          return reject(
            new HttpError(
              413,
              'too_large',
              `The photo is larger than ${mb} MB: take it at a lower resolution`,
            ),
          )
        }
        return reject(
          new HttpError(
            400,
            'invalid_upload',
            `Send one photo as the "file" field (${err.message})`,
          ),
        )
      }
      reject(err)
    })
  })
}

const photoFieldsSchema = z.object({
  clientId: z.string().uuid('clientId must be a UUID made on the device'),
  caption: z.string().trim().max(300).default(''),
  partId: z.coerce.number().int().positive().optional(),
})

export function toPhotoRow(p: Photo, byName: string): PhotoRow {
  return {
    id: p.id,
    partId: p.partId,
    caption: p.caption,
    width: p.width,
    height: p.height,
    uploaded: { byId: p.uploadedBy, byName, at: p.uploadedAt.toISOString() },
  }
}

/**
 * POST /api/parts/:id/photos (target.partId) or /api/lots/:id/photos (target.lotId, optional
 * partId field). Answers the stored PhotoRow; a replayed clientId answers the first upload.
 */
export async function uploadPhoto(
  actor: AuditActor & { name: string },
  target: { partId?: number; lotId?: number; nonconformanceId?: number },
  req: Request,
  res: Response,
): Promise<{ photo: PhotoRow; created: boolean }> {
  await receive(req, res)
  assertStorableText(req.body, 'body')
  const fields = photoFieldsSchema.safeParse(req.body ?? {})
  if (!fields.success) {
    const issue = fields.error.issues[0]!
    const field = `body.${issue.path.join('.')}`
    throw new HttpError(400, 'invalid_input', `${field}: ${issue.message}`, [
      { field, message: issue.message },
    ])
  }
  const file = req.file
  if (!file) throw new HttpError(400, 'invalid_upload', 'Attach the photo as the "file" field')
  const image = await checkImage(file.buffer)
  return inTransaction(async (t) => {
    const replay = await Photo.findOne({
      where: { clientId: fields.data.clientId },
      attributes: { exclude: ['data', 'thumb'] },
      transaction: t,
    })
    if (replay) {
      const by = await User.findByPk(replay.uploadedBy, { attributes: ['name'], transaction: t })
      return { photo: toPhotoRow(replay, by?.name ?? ''), created: false }
    }
    const partId = target.partId ?? fields.data.partId ?? null
    let lotId = target.lotId ?? null
    if (partId !== null) {
      const part = await Part.findByPk(partId, {
        attributes: ['id', 'lotId', 'partNumber'],
        transaction: t,
      })
      if (!part) throw notFound(`Part #${partId}`)
      if (lotId !== null && part.lotId !== lotId) {
        throw new HttpError(
          400,
          'part_of_another_lot',
          `Part ${part.partNumber} (#${part.id}) belongs to another lot, not to lot #${lotId}`,
        )
      }
      lotId = part.lotId
    }
    const lot = await Lot.findByPk(lotId!, { lock: t.LOCK.SHARE, transaction: t })
    if (!lot) throw notFound(`Lot #${lotId}`)
    // Evidence of a nonconformance may come in any lot state (damage is found on the dock too).
    if (target.nonconformanceId === undefined) assertLotOpen(lot, 'before photos are added')
    const photo = await Photo.create(
      {
        lotId: lot.id,
        partId,
        nonconformanceId: target.nonconformanceId ?? null,
        caption: fields.data.caption,
        mime: image.mime,
        byteSize: file.size,
        width: image.width,
        height: image.height,
        data: file.buffer,
        thumb: image.thumb,
        uploadedBy: actor.id,
        clientId: fields.data.clientId,
      },
      { transaction: t },
    )
    const row = toPhotoRow(photo, actor.name)
    await recordAudit(t, actor, {
      action: 'photo.upload',
      entityType: 'photo',
      entityId: photo.id,
      lotId: lot.id,
      after: { ...row, mime: image.mime, byteSize: file.size },
    })
    return { photo: row, created: true }
  })
}

/** GET /api/photos/:id and /thumb: the bytes, typed by what was checked at upload. */
export async function sendPhoto(id: number, which: 'data' | 'thumb', res: Response) {
  const photo = await Photo.findByPk(id, { attributes: ['id', 'mime', which] })
  if (!photo) throw notFound(`Photo #${id}`)
  const bytes = which === 'data' ? photo.data : photo.thumb
  res.setHeader('Content-Type', which === 'data' ? photo.mime : 'image/webp')
  // Quality records: the browser may keep them, shared caches must not.
  res.setHeader('Cache-Control', 'private, max-age=86400')
  res.setHeader(
    'Content-Disposition',
    `inline; filename="photo-${photo.id}${which === 'thumb' ? '-thumb' : ''}"`,
  )
  res.send(bytes)
}
