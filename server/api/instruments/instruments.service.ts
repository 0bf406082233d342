import { Op, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction } from '../../db'
import { Instrument } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict, notFound } from '../../lib/httpError'
import { RowCache } from '../../lib/rowCache'
import { INSTRUMENT_KIND_LABELS, type InstrumentKind } from '../../../shared/api/instruments'
import {
  calibrationState,
  calibrationValidOn,
  localIsoDate,
  overdueSince,
} from '../../../shared/api/calibration'
import type {
  InstrumentRow,
  createInstrumentSchema,
  updateInstrumentSchema,
} from '../../../shared/api/setup'

type CreateInstrumentBody = z.infer<typeof createInstrumentSchema>
type UpdateInstrumentBody = z.infer<typeof updateInstrumentSchema>

export function toInstrumentRow(i: Instrument, today: string = localIsoDate()): InstrumentRow {
  return {
    id: i.id,
    kind: i.kind,
    serial: i.serial,
    description: i.description,
    calibratedOn: i.calibratedOn,
    calibrationDueOn: i.calibrationDueOn,
    certificateRef: i.certificateRef,
    active: i.active,
    ...calibrationState(i.calibrationDueOn, today),
  }
}

export async function listInstruments(): Promise<InstrumentRow[]> {
  const today = localIsoDate()
  const instruments = await Instrument.findAll({
    order: [
      ['kind', 'ASC'],
      ['serial', 'ASC'],
    ],
  })
  return instruments.map((i) => toInstrumentRow(i, today))
}

function assertDatesInOrder(calibratedOn: string | null, calibrationDueOn: string) {
  if (calibratedOn !== null && calibratedOn > calibrationDueOn) {
    const message = `The calibration due date (${calibrationDueOn}) is before the calibration date (${calibratedOn})`
    throw new HttpError(400, 'invalid_input', message, [
      { field: 'body.calibrationDueOn', message },
    ])
  }
}

async function assertSerialFree(serial: string, exceptId: number | null, t: Transaction) {
  const same = await Instrument.findOne({
    where: { serial, ...(exceptId === null ? {} : { id: { [Op.ne]: exceptId } }) },
    transaction: t,
  })
  if (same)
    throw conflict(
      'duplicate_serial',
      `An instrument with serial number ${serial} is already registered`,
    )
}

export async function createInstrument(
  actor: AuditActor,
  body: CreateInstrumentBody,
): Promise<InstrumentRow> {
  assertDatesInOrder(body.calibratedOn, body.calibrationDueOn)
  return inTransaction(async (t) => {
    await assertSerialFree(body.serial, null, t)
    const instrument = await Instrument.create(
      {
        kind: body.kind,
        serial: body.serial,
        description: body.description,
        calibratedOn: body.calibratedOn,
        calibrationDueOn: body.calibrationDueOn,
        certificateRef: body.certificateRef,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'instrument.create',
      entityType: 'instrument',
      entityId: instrument.id,
      after: instrument,
    })
    return toInstrumentRow(instrument)
  })
}

const EDITABLE = [
  'kind',
  'serial',
  'description',
  'calibratedOn',
  'calibrationDueOn',
  'certificateRef',
  'active',
] as const

/** A new calibration is recorded here too: a later due date (and certificate) on the same row. */
export async function updateInstrument(
  actor: AuditActor,
  id: number,
  body: UpdateInstrumentBody,
): Promise<InstrumentRow> {
  return inTransaction(async (t) => {
    const instrument = await Instrument.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!instrument) throw notFound('Instrument')
    if (body.serial !== undefined && body.serial !== instrument.serial)
      await assertSerialFree(body.serial, id, t)
    assertDatesInOrder(
      body.calibratedOn !== undefined ? body.calibratedOn : instrument.calibratedOn,
      body.calibrationDueOn ?? instrument.calibrationDueOn,
    )
    const before = snapshot(instrument)
    const changes: Partial<Instrument> = {}
    for (const key of EDITABLE) {
      const value = body[key]
      if (value !== undefined && value !== instrument[key]) Object.assign(changes, { [key]: value })
    }
    if (Object.keys(changes).length > 0) {
      await instrument.update({ ...changes, version: instrument.version + 1 }, { transaction: t })
      await recordAudit(t, actor, {
        action: 'instrument.update',
        entityType: 'instrument',
        entityId: id,
        before,
        after: instrument,
      })
    }
    return toInstrumentRow(instrument)
  })
}

function kindNames(kinds: readonly InstrumentKind[]): string {
  return kinds.map((k) => INSTRUMENT_KIND_LABELS[k]).join(' or ')
}

/**
 * Gauges are checked on every readings batch: their rows are kept for a few seconds (dropped at
 * once on any change made through the app in this process; another process's change is seen
 * within INSTRUMENT_CACHE_MS — see RowCache).
 */
const INSTRUMENT_CACHE_MS = 5000
const usableCheckRows = new RowCache(Instrument, INSTRUMENT_CACHE_MS)

/**
 * For the readings feature: refuses a reading taken with an instrument that is unknown (400),
 * of the wrong kind (400), retired (409) or out of calibration on the reading's date (409).
 * `atDate` is the day the reading was taken (a Date, or YYYY-MM-DD); `field` names the input in the
 * error details. Returns the instrument.
 */
export async function assertInstrumentUsable(
  instrumentId: number,
  kinds: readonly InstrumentKind[],
  atDate: Date | string,
  t?: Transaction,
  field = 'body.instrumentId',
): Promise<Instrument> {
  const instrument = await usableCheckRows.get(instrumentId, t)
  const fieldError = (status: number, code: string, message: string) =>
    new HttpError(status, code, message, [{ field, message }])
  if (!instrument)
    throw fieldError(400, 'invalid_reference', `Instrument #${instrumentId} is not registered`)
  if (kinds.length > 0 && !kinds.includes(instrument.kind)) {
    throw fieldError(
      400,
      'wrong_instrument_kind',
      `Instrument ${instrument.serial} is a ${INSTRUMENT_KIND_LABELS[instrument.kind]}; this reading needs a ${kindNames(kinds)}`,
    )
  }
  if (!instrument.active) {
    throw fieldError(
      409,
      'instrument_retired',
      `Instrument ${instrument.serial} has been taken out of service`,
    )
  }
  const onDate = typeof atDate === 'string' ? atDate : localIsoDate(atDate)
  if (!calibrationValidOn(instrument.calibrationDueOn, onDate)) {
    throw fieldError(
      409,
      'calibration_overdue',
      `Instrument ${instrument.serial} is out of calibration: its calibration was due ${instrument.calibrationDueOn}, ` +
        `so it is overdue since ${overdueSince(instrument.calibrationDueOn)}. Use a calibrated instrument or record its new calibration first`,
    )
  }
  return instrument
}
