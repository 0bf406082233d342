import type { Request, Response } from 'express'
import { Nonconformance, type User } from '../../db/models'
import { conflict, notFound } from '../../lib/httpError'
import type { PhotoRow } from '../../../shared/api/lots'
import { uploadPhoto } from '../photos/photos.service'

/**
 * POST /api/nonconformances/:id/photos: the shop floor's photo upload (same checks, same
 * storage), filed under the nonconformance and its lot. A closed record takes no more evidence.
 */
export async function uploadNcPhoto(
  user: User,
  ncId: number,
  req: Request,
  res: Response,
): Promise<{ photo: PhotoRow; created: boolean }> {
  const nc = await Nonconformance.findByPk(ncId, {
    attributes: ['id', 'lotId', 'number', 'status'],
  })
  if (!nc) throw notFound(`Nonconformance #${ncId}`)
  if (nc.status === 'closed')
    throw conflict(
      'nc_closed',
      `${nc.number} is closed: open a new nonconformance for what the photo shows`,
    )
  return uploadPhoto(user, { lotId: nc.lotId, nonconformanceId: nc.id }, req, res)
}
