import type { Transaction } from 'sequelize'
import type { z } from 'zod'
import { commitWith, inPipelinedTransaction } from '../../db/pipelinedTransaction'
import { HttpError } from '../../lib/httpError'
import { logger } from '../../lib/logger'
import type { ReadingsBatchResult, readingSchema } from '../../../shared/api/lots'
import { assertLotOpen } from '../lots/lotGuards'
import { recordAudits } from '../../audit/audit.service'
import { lockPartsForWrite, type LockedPart } from '../parts/partLock'
import { loadVerdictRowsOf, storeVerdicts, verdictFromStoredRows } from '../parts/partVerdict'
import {
  checkBatchShape,
  checkGauges,
  postReadings,
  recordedAuditEntry,
  rowsAsInserted,
  sendInserts,
  type InsertedRow,
  type Recorder,
} from './readings.service'

/**
 * Group commit for readings POSTs. While readings of other parts are being stored, the POSTs that
 * arrive meanwhile wait (microseconds to milliseconds) and are then stored together in one
 * transaction: one BEGIN, one COMMIT, three network round trips and five statements for the
 * whole group instead of three round trips and five statements each. Each POST still gets exactly
 * the answer, the verdict and the audit event it would get alone; nothing is acknowledged before
 * the COMMIT that stored it.
 *
 * A group only takes the plain case: every part exists, its lot is open, the gauges are usable
 * and every reading is new. A POST that fails a check before anything is written is taken out
 * and runs alone after the group (postReadings gives it its exact error or replay answer). If
 * anything else goes wrong (a reading already stored, a clientId of another part, a failed
 * statement, a lost connection) the group's transaction is rolled back and every POST of it runs
 * alone: idempotency by clientId makes that safe even when the COMMIT's answer was lost. On a
 * quiet line (one tablet at a time) every POST runs alone, as postReadings.
 */

type ReadingBody = z.infer<typeof readingSchema>
export type ReadingsOutcome = { result: ReadingsBatchResult; created: boolean }

export interface WaitingPost {
  actor: Recorder
  partId: number
  readings: ReadingBody[]
  resolve(outcome: ReadingsOutcome): void
  reject(err: unknown): void
}

/** Groups in flight at once per process (each holds one pooled connection). */
const GROUPS_IN_FLIGHT = 2
/** POSTs per group: bounds how long one transaction holds its row locks. */
const GROUP_MAX = 24

const waiting: WaitingPost[] = []
let inFlight = 0

/** For the tests: groups stored, POSTs stored in them, groups rolled back to run alone. */
export const commitGroupStats = { groups: 0, groupedPosts: 0, fallbacks: 0 }

/** POST /api/parts/:id/readings: stored alone or with the POSTs of other parts that came meanwhile. */
export function submitReadings(
  actor: Recorder,
  partId: number,
  readings: ReadingBody[],
): Promise<ReadingsOutcome> {
  checkBatchShape(readings)
  return new Promise((resolve, reject) => {
    waiting.push({ actor, partId, readings, resolve, reject })
    startGroups()
  })
}

function startGroups() {
  while (inFlight < GROUPS_IN_FLIGHT && waiting.length > 0) {
    const group = takeGroup()
    inFlight += 1
    void storeGroup(group).finally(() => {
      inFlight -= 1
      startGroups()
    })
  }
}

/** The oldest waiting POSTs, one per part (a second POST to a part waits for the next group). */
function takeGroup(): WaitingPost[] {
  const parts = new Set<number>()
  const group: WaitingPost[] = []
  for (let i = 0; i < waiting.length && group.length < GROUP_MAX;) {
    const post = waiting[i]!
    if (parts.has(post.partId)) {
      i += 1
      continue
    }
    parts.add(post.partId)
    group.push(post)
    waiting.splice(i, 1)
  }
  return group
}

function runAlone(post: WaitingPost): Promise<void> {
  return postReadings(post.actor, post.partId, post.readings).then(post.resolve, post.reject)
}

async function storeGroup(group: WaitingPost[]): Promise<void> {
  if (group.length === 1) return runAlone(group[0]!)
  let stored: [WaitingPost, ReadingsOutcome][] = []
  let alone: WaitingPost[]
  try {
    ;({ stored, alone } = await inPipelinedTransaction((t) => storeTogether(group, t)))
    commitGroupStats.groups += 1
    commitGroupStats.groupedPosts += stored.length
  } catch (err) {
    // Rolled back (or its COMMIT's answer lost): nothing is acknowledged, each POST runs alone.
    if (!(err instanceof PlainCaseOnly))
      logger.warn({ err, posts: group.length }, 'readings commit group failed; storing each alone')
    commitGroupStats.fallbacks += 1
    stored = []
    alone = group
  }
  for (const [post, outcome] of stored) post.resolve(outcome)
  await Promise.all(alone.map(runAlone))
}

/** A group met a POST that is not the plain case after its INSERT was sent: roll back, run alone. */
class PlainCaseOnly extends Error {}

interface Checked {
  post: WaitingPost
  part: LockedPart
  serials: Map<number, string>
}

/** Five statements for the whole group: the locks, the INSERT, the verdicts' rows, the UPDATE, the audit. */
async function storeTogether(group: WaitingPost[], t: Transaction) {
  // One statement takes every lock, in part id order: two groups never wait on each other in a ring.
  const locked = await lockPartsForWrite(
    group.map((post) => post.partId),
    t,
  )
  const checked: Checked[] = []
  const alone: WaitingPost[] = []
  for (const post of group) {
    const part = locked.get(post.partId)
    if (!part) {
      alone.push(post) // no such part: its 404 comes from postReadings
      continue
    }
    try {
      assertLotOpen(
        { lotNumber: part.lotNumber, status: part.lotStatus },
        'before readings are added',
      )
      checked.push({ post, part, serials: await checkGauges(post.readings, t) })
    } catch (err) {
      if (!(err instanceof HttpError)) throw err
      alone.push(post) // its error, or its replay answer, comes from postReadings
    }
  }
  if (checked.length === 0) return { stored: [] as [WaitingPost, ReadingsOutcome][], alone }

  // The INSERT and the read of the parts' rows leave together; the read sees the new rows.
  const [inserted, verdictRows] = await Promise.all([
    sendInserts(
      t,
      checked.map(({ post, part }) => ({ part, actor: post.actor, readings: post.readings })),
    ),
    loadVerdictRowsOf(
      checked.map(({ part }) => part),
      t,
    ),
  ])
  const insertedOf = new Map<number, InsertedRow[]>()
  for (const row of inserted) {
    const rows = insertedOf.get(row.part_id)
    if (rows) rows.push(row)
    else insertedOf.set(row.part_id, [row])
  }
  if (checked.some(({ post, part }) => insertedOf.get(part.id)?.length !== post.readings.length))
    throw new PlainCaseOnly()

  const stored = checked.map(({ post, part, serials }) => {
    const rows = insertedOf.get(part.id)!
    const judged = verdictFromStoredRows(part.spec, part, verdictRows.get(part.id)!)
    const outcome: ReadingsOutcome = {
      result: {
        readings: rowsAsInserted(rows, post.readings, part.round, post.actor, serials),
        storedCount: rows.length,
        partId: part.id,
        partVersion: part.version,
        verdict: judged.verdict,
      },
      created: true,
    }
    return { post, part, rows, judged, outcome }
  })
  await commitWith(t, [
    storeVerdicts(
      stored.map((s) => ({ partId: s.part.id, judged: s.judged })),
      t,
    ),
    recordAudits(
      t,
      stored.map((s) => ({
        actor: s.post.actor,
        entry: recordedAuditEntry(s.part, s.rows, s.judged.verdict),
      })),
    ),
  ])
  return { stored: stored.map((s) => [s.post, s.outcome] as [WaitingPost, ReadingsOutcome]), alone }
}
