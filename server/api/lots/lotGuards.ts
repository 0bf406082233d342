import type { Line, LotStatus } from '../../../shared/api/lots'
import { localIsoDate } from '../../../shared/api/calibration'
import { HttpError } from '../../lib/httpError'

const STATUS_WORDS: Record<Exclude<LotStatus, 'open'>, string> = {
  'awaiting-review': 'is awaiting review',
  'on-hold': 'is on hold',
  released: 'has been released',
  rejected: 'has been rejected',
}

/**
 * Inspection records are added only while a lot is open: once it is in review, on hold or
 * decided, what the supervisor judged must not move under them. `doing` completes the sentence,
 * e.g. "before readings are added".
 */
export function assertLotOpen(lot: { lotNumber: string; status: LotStatus }, doing: string) {
  if (lot.status === 'open') return
  const advice =
    lot.status === 'released'
      ? 'its inspection records can no longer change; to correct them, reopen the lot with a reason (QA)'
      : lot.status === 'rejected'
        ? 'its inspection records can no longer change'
        : `a supervisor must reopen it ${doing}`
  throw new HttpError(
    409,
    'lot_not_open',
    `Lot ${lot.lotNumber} ${STATUS_WORDS[lot.status]}: ${advice}`,
    {
      lotNumber: lot.lotNumber,
      status: lot.status,
    },
  )
}

/** A powder or paint batch past its expiry date is never applied (its data sheet no longer holds). */
export function assertBatchInDate(
  line: Line,
  batchNumber: string,
  expiresOn: string,
  today = localIsoDate(),
) {
  if (expiresOn >= today) return
  const what = line === 'fbe-powder' ? 'Powder batch' : 'Paint batch'
  const message = `${what} ${batchNumber} expired on ${expiresOn}: use an in-date batch`
  throw new HttpError(400, 'batch_expired', message, [{ field: 'body.batchExpiresOn', message }])
}
