import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { sequelize } from '../../db'
import { commitWith, inPipelinedTransaction } from '../../db/pipelinedTransaction'
import { preparedQuery } from '../../db/prepared'
import { recordAudit, type AuditActor, type AuditEntry } from '../../audit/audit.service'
import { HttpError, conflict } from '../../lib/httpError'
import type { ReadingRow, ReadingsBatchResult, readingSchema } from '../../../shared/api/lots'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import { localIsoDate } from '../../../shared/api/calibration'
import { assertInstrumentUsable } from '../instruments/instruments.service'
import { assertLotOpen } from '../lots/lotGuards'
import { lockPartForWrite, type LockedPart } from '../parts/partLock'
import { loadVerdictRows, storeVerdict, verdictFromStoredRows } from '../parts/partVerdict'
import { readingRows } from '../parts/partDetail'
import { FOREIGN_CLIENT_IDS, INSERT_READINGS } from './readings.sql'

type ReadingBody = z.infer<typeof readingSchema>
export type Recorder = AuditActor & { name: string }

export const DFT_GAUGE_KINDS = ['dft-gauge-type1', 'dft-gauge-type2'] as const
/** Tablet clocks drift; a reading "taken" further ahead than this is a wrong clock, not a reading. */
const FUTURE_SLACK_MS = 10 * 60_000

export function checkBatchShape(readings: ReadingBody[]) {
  const seen = new Set<string>()
  const now = Date.now()
  readings.forEach((r, i) => {
    if (seen.has(r.clientId)) {
      const message = 'The same clientId appears twice in one batch'
      throw new HttpError(400, 'invalid_input', message, [
        { field: `body.readings.${i}.clientId`, message },
      ])
    }
    seen.add(r.clientId)
    if (r.takenAt && Date.parse(r.takenAt) > now + FUTURE_SLACK_MS) {
      const message = `Reading taken at ${r.takenAt} is in the future: check the tablet's clock`
      throw new HttpError(400, 'invalid_input', message, [
        { field: `body.readings.${i}.takenAt`, message },
      ])
    }
  })
}

/** Each distinct gauge, on each day it was used, must be a DFT gauge in calibration. */
export async function checkGauges(
  readings: ReadingBody[],
  t: Transaction,
): Promise<Map<number, string>> {
  const serials = new Map<number, string>()
  const checked = new Set<string>()
  for (const r of readings) {
    const day = r.takenAt ? localIsoDate(new Date(r.takenAt)) : localIsoDate()
    const key = `${r.instrumentId}@${day}`
    if (checked.has(key)) continue
    checked.add(key)
    const instrument = await assertInstrumentUsable(r.instrumentId, DFT_GAUGE_KINDS, day, t)
    serials.set(instrument.id, instrument.serial)
  }
  return serials
}

async function storedVerdict(partId: number, t: Transaction): Promise<PartVerdict> {
  const [row] = await sequelize.query<{ verdict: PartVerdict }>(
    'SELECT verdict FROM parts WHERE id = $1',
    {
      bind: [partId],
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  return row!.verdict
}

function inSentOrder(rows: ReadingRow[], readings: ReadingBody[]): ReadingRow[] {
  const byClient = new Map(rows.map((r) => [r.clientId, r]))
  return readings.flatMap((r) => byClient.get(r.clientId) ?? [])
}

export interface InsertedRow {
  id: string
  part_id: number
  client_id: string
  suspect: boolean
  taken_at: Date
  recorded_at: Date
}

/** The answer's rows for a batch stored whole, from the INSERT's RETURNING (no query). */
export function rowsAsInserted(
  inserted: InsertedRow[],
  readings: ReadingBody[],
  round: number,
  actor: Recorder,
  serials: Map<number, string>,
): ReadingRow[] {
  const byClient = new Map(inserted.map((r) => [r.client_id, r]))
  return readings.map((r) => {
    const s = byClient.get(r.clientId)!
    return {
      id: String(s.id),
      clientId: r.clientId,
      round,
      areaNo: r.areaNo,
      spotNo: r.spotNo,
      thicknessUm: r.thicknessUm,
      instrumentId: r.instrumentId,
      instrumentSerial: serials.get(r.instrumentId)!,
      suspect: s.suspect,
      discarded: false,
      discardReason: null,
      takenAt: new Date(s.taken_at).toISOString(),
      recorded: { byId: actor.id, byName: actor.name, at: new Date(s.recorded_at).toISOString() },
    }
  })
}

/** The batch's one INSERT (sent at once: the connection pipelines). */
export function sendInsert(
  t: Transaction,
  part: LockedPart,
  actor: Recorder,
  readings: ReadingBody[],
): Promise<InsertedRow[]> {
  return sendInserts(t, [{ part, actor, readings }])
}

/** The batches of several parts in the same one INSERT; the rows come back with their part_id. */
export function sendInserts(
  t: Transaction,
  batches: { part: LockedPart; actor: Recorder; readings: ReadingBody[] }[],
): Promise<InsertedRow[]> {
  const each = <T>(pick: (b: (typeof batches)[number], r: ReadingBody) => T) =>
    batches.flatMap((b) => b.readings.map((r) => pick(b, r)))
  return preparedQuery<InsertedRow>(t, 'readings_insert_many', INSERT_READINGS, [
    each((b) => b.part.id),
    each((b) => b.part.lotId),
    each((b) => b.part.round),
    each((b) => b.actor.id),
    each((_, r) => r.areaNo),
    each((_, r) => r.spotNo),
    each((_, r) => r.thicknessUm),
    each((_, r) => r.instrumentId),
    each((_, r) => r.takenAt ?? null),
    each((_, r) => r.clientId),
  ])
}

/** The audit event of stored readings (sent at once, like the verdict's UPDATE beside it). */
export function sendRecordedAudit(
  t: Transaction,
  actor: Recorder,
  part: LockedPart,
  inserted: InsertedRow[],
  verdict: PartVerdict,
): Promise<void> {
  return recordAudit(t, actor, recordedAuditEntry(part, inserted, verdict))
}

export function recordedAuditEntry(
  part: LockedPart,
  inserted: InsertedRow[],
  verdict: PartVerdict,
): AuditEntry {
  return {
    action: 'readings.record',
    entityType: 'part',
    entityId: part.id,
    lotId: part.lotId,
    after: {
      readingIds: inserted.map((r) => String(r.id)),
      round: part.round,
      suspectCount: inserted.filter((r) => r.suspect).length,
      verdictStatus: verdict.status,
      progress: verdict.samplingPlan.progress,
    },
  }
}

/** A batch whose every reading is already stored for this part: answer it as stored. */
async function replayOf(part: LockedPart, readings: ReadingBody[], t: Transaction) {
  const ids = readings.map((r) => r.clientId)
  const stored = await readingRows(
    'r.client_id = ANY($1::uuid[]) AND r.part_id = $2',
    [ids, part.id],
    t,
  )
  return stored.length === readings.length ? inSentOrder(stored, readings) : null
}

/**
 * POST /api/parts/:id/readings. One INSERT for the batch, one query for the part's rows, one
 * UPDATE for its verdict, one audit event: all in one transaction. Idempotent by clientId.
 * Three round trips (server/db/pipelinedTransaction.ts): BEGIN + the lock; INSERT + the part's
 * rows; verdict UPDATE + audit event + COMMIT.
 */
export async function postReadings(
  actor: Recorder,
  partId: number,
  readings: ReadingBody[],
): Promise<{ result: ReadingsBatchResult; created: boolean }> {
  checkBatchShape(readings)
  return inPipelinedTransaction(async (t) => {
    const part = await lockPartForWrite(partId, t)
    const replayAnswer = async (rows: ReadingRow[]) => ({
      result: {
        readings: rows,
        storedCount: 0,
        partId,
        partVersion: part.version,
        verdict: await storedVerdict(partId, t),
      },
      created: false,
    })
    let serials: Map<number, string>
    try {
      assertLotOpen(
        { lotNumber: part.lotNumber, status: part.lotStatus },
        'before readings are added',
      )
      serials = await checkGauges(readings, t)
    } catch (err) {
      // The answer to a batch that was stored may have been lost on the way back to the
      // tablet; its resend must not fail just because the lot has moved on since.
      const rows = await replayOf(part, readings, t)
      if (rows) return replayAnswer(rows)
      throw err
    }
    // The INSERT and the read of the part's rows for its verdict leave together (the connection
    // pipelines; the read, later in the same transaction, sees the new rows); so do the verdict's
    // UPDATE and the audit event. One network round trip each instead of two.
    const [inserted, verdictRows] = await Promise.all([
      sendInsert(t, part, actor, readings),
      loadVerdictRows(part.id, part.round, t),
    ])
    if (inserted.length < readings.length) {
      const foreign = await sequelize.query(FOREIGN_CLIENT_IDS, {
        bind: [readings.map((r) => r.clientId), part.id],
        type: QueryTypes.SELECT,
        transaction: t,
      })
      if (foreign.length)
        throw conflict(
          'client_id_reused',
          'A clientId of this batch already belongs to a reading of another part',
        )
    }
    if (inserted.length === 0)
      return replayAnswer(
        inSentOrder(
          await readingRows('r.client_id = ANY($1::uuid[])', [readings.map((r) => r.clientId)], t),
          readings,
        ),
      )

    const judged = verdictFromStoredRows(part.spec, part, verdictRows)
    const verdict = judged.verdict
    const last = [
      storeVerdict(part.id, judged, t),
      sendRecordedAudit(t, actor, part, inserted, verdict),
    ] as const
    let rows: ReadingRow[]
    if (inserted.length === readings.length) {
      await commitWith(t, [...last])
      rows = rowsAsInserted(inserted, readings, part.round, actor, serials)
    } else {
      // Part of the batch was stored by an earlier send whose answer was lost: read it all back.
      const ids = readings.map((r) => r.clientId)
      const [, , stored] = await Promise.all([
        ...last,
        readingRows('r.client_id = ANY($1::uuid[])', [ids], t),
      ])
      rows = inSentOrder(stored, readings)
    }
    return {
      result: {
        readings: rows,
        storedCount: inserted.length,
        partId: part.id,
        partVersion: part.version,
        verdict,
      },
      created: true,
    }
  })
}
