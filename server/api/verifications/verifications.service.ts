import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { AuditEvent, Instrument, InstrumentVerification, User } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type {
  VerificationResult,
  VerificationRow,
  verificationSchema,
} from '../../../shared/api/lots'
import { lockPartForWrite } from '../parts/partLock'
import { recomputePartVerdict } from '../parts/partVerdict'

type VerificationBody = z.infer<typeof verificationSchema>
type Recorder = AuditActor & { name: string }

/** Floating-point slack so 264.0 against 254 ± 10 is the pass it is on paper. */
const EPSILON_UM = 1e-9

export function verificationPassed(
  referenceNominalUm: number,
  readingUm: number,
  toleranceUm: number,
): boolean {
  return Math.abs(readingUm - referenceNominalUm) <= toleranceUm + EPSILON_UM
}

function toRow(v: InstrumentVerification, serial: string, byName: string): VerificationRow {
  return {
    id: v.id,
    clientId: v.clientId,
    instrumentId: v.instrumentId,
    instrumentSerial: serial,
    referenceNominalUm: v.referenceNominalUm,
    toleranceUm: v.toleranceUm,
    readingUm: v.readingUm,
    passed: v.passed,
    occasion: v.occasion,
    verified: { byId: v.verifiedBy, byName, at: v.verifiedAt.toISOString() },
  }
}

/** The readings a failed check puts in doubt: every live one since the gauge's last passed check (all, if none). */
async function readingsInDoubt(instrumentId: number, t: Transaction) {
  return sequelize.query<{ part_id: number; lot_id: number; lot_number: string; status: string }>(
    `SELECT DISTINCT r.part_id, r.lot_id, l.lot_number, l.status
       FROM gauge_readings r JOIN lots l ON l.id = r.lot_id
      WHERE r.instrument_id = $1 AND r.discarded_at IS NULL AND NOT r.suspect
        AND r.taken_at > coalesce((SELECT max(verified_at) FROM instrument_verifications
                                    WHERE instrument_id = $1 AND passed), '-infinity')
      ORDER BY r.part_id`,
    { bind: [instrumentId], type: QueryTypes.SELECT, transaction: t },
  )
}

/**
 * POST /api/instruments/:id/verifications. A failed check (ASTM D7091 via SSPC-PA 2: every
 * reading since the last good check is suspect) flags those readings and recomputes the parts:
 * a part with suspect readings cannot pass until they are discarded and re-measured.
 * Parts of released or rejected lots are flagged but keep their verdict; the answer names those lots.
 */
export async function recordVerification(
  actor: Recorder,
  instrumentId: number,
  body: VerificationBody,
): Promise<{ result: VerificationResult; created: boolean }> {
  return inTransaction(async (t) => {
    const instrument = await Instrument.findByPk(instrumentId, { transaction: t })
    if (!instrument) throw notFound(`Instrument #${instrumentId}`)
    const replay = await InstrumentVerification.findOne({
      where: { clientId: body.clientId },
      transaction: t,
    })
    if (replay) {
      if (replay.instrumentId !== instrumentId)
        throw conflict(
          'client_id_reused',
          'This clientId already belongs to a check of another instrument',
        )
      const event = await AuditEvent.findOne({
        where: { entityType: 'instrument-verification', entityId: String(replay.id) },
        transaction: t,
      })
      const after = (event?.after ?? {}) as Partial<VerificationResult>
      return {
        result: {
          verification: toRow(
            replay,
            instrument.serial,
            (await User.findByPk(replay.verifiedBy, { attributes: ['name'], transaction: t }))
              ?.name ?? '',
          ),
          suspectCount: after.suspectCount ?? 0,
          affectedPartIds: after.affectedPartIds ?? [],
          closedLotsAffected: after.closedLotsAffected ?? [],
        },
        created: false,
      }
    }
    const passed = verificationPassed(body.referenceNominalUm, body.readingUm, body.toleranceUm)
    // Rows in doubt are found before the new check is stored, and their parts locked before
    // the readings are flagged: the same lock order as every other write to a part.
    const doubt = passed ? [] : await readingsInDoubt(instrumentId, t)
    const openParts = doubt.filter((d) => d.status !== 'released' && d.status !== 'rejected')
    const locked = []
    for (const d of openParts) locked.push(await lockPartForWrite(d.part_id, t))
    const verification = await InstrumentVerification.create(
      { instrumentId, ...body, passed, verifiedBy: actor.id },
      { transaction: t },
    )
    let suspectCount = 0
    if (!passed) {
      const [, n] = await sequelize.query(
        `UPDATE gauge_readings SET suspect = true
          WHERE instrument_id = $1 AND discarded_at IS NULL AND NOT suspect
            AND taken_at > coalesce((SELECT max(verified_at) FROM instrument_verifications
                                      WHERE instrument_id = $1 AND passed), '-infinity')`,
        { bind: [instrumentId], type: QueryTypes.UPDATE, transaction: t },
      )
      suspectCount = n
      for (const part of locked) await recomputePartVerdict(part.spec, part, t)
    }
    const closedLotsAffected = [
      ...new Set(doubt.filter((d) => !openParts.includes(d)).map((d) => d.lot_number)),
    ]
    const result: VerificationResult = {
      verification: toRow(verification, instrument.serial, actor.name),
      suspectCount,
      affectedPartIds: locked.map((p) => p.id),
      closedLotsAffected,
    }
    await recordAudit(t, actor, {
      action: passed ? 'instrument.verification-passed' : 'instrument.verification-failed',
      entityType: 'instrument-verification',
      entityId: verification.id,
      after: {
        ...result,
        verification: undefined,
        instrumentId,
        serial: instrument.serial,
        passed,
      },
    })
    for (const lotId of new Set(doubt.map((d) => d.lot_id))) {
      await recordAudit(t, actor, {
        action: 'readings.suspect',
        entityType: 'lot',
        entityId: lotId,
        lotId,
        note: `Gauge ${instrument.serial} failed its ${body.occasion} check (read ${body.readingUm} µm on a ${body.referenceNominalUm} ± ${body.toleranceUm} µm standard): readings since its last good check are suspect`,
      })
    }
    return { result, created: true }
  })
}

/** GET /api/instruments/:id/verifications: newest first. */
export async function listVerifications(instrumentId: number): Promise<VerificationRow[]> {
  const instrument = await Instrument.findByPk(instrumentId)
  if (!instrument) throw notFound(`Instrument #${instrumentId}`)
  const rows = await sequelize.query<{ id: number; name: string }>(
    `SELECT v.id, u.name FROM instrument_verifications v JOIN users u ON u.id = v.verified_by
      WHERE v.instrument_id = $1 ORDER BY v.verified_at DESC LIMIT 500`,
    { bind: [instrumentId], type: QueryTypes.SELECT },
  )
  const names = new Map(rows.map((r) => [r.id, r.name]))
  const models = await InstrumentVerification.findAll({
    where: { id: rows.map((r) => r.id) },
    order: [['verifiedAt', 'DESC']],
  })
  return models.map((v) => toRow(v, instrument.serial, names.get(v.id) ?? ''))
}
