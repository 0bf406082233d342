import { inTransaction } from '../../db'
import { SectionRecord } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict } from '../../lib/httpError'
import { sectionDataSchemas, type PartDetail, type SectionName } from '../../../shared/api/lots'
import type { InstrumentKind } from '../../../shared/api/instruments'
import { assertInstrumentUsable } from '../instruments/instruments.service'
import { assertLotOpen } from '../lots/lotGuards'
import { recomputePartVerdict } from './partVerdict'
import { lockPartForWrite } from './partLock'
import { getPartDetail } from './partDetail'

/** The instruments that can stand behind each section's numbers. */
export const SECTION_INSTRUMENT_KINDS: Record<SectionName, readonly InstrumentKind[]> = {
  climate: ['surface-thermometer', 'hygrometer'],
  'surface-prep': ['profile-gauge', 'replica-tape-micrometer'],
  holiday: ['holiday-low-voltage', 'holiday-high-voltage'],
  cure: ['oven-recorder'],
  'thickness-gauge': ['dft-gauge-type1', 'dft-gauge-type2'],
  adhesion: [],
  notes: [],
}

const GAUGE_TYPE_OF_KIND: Partial<Record<InstrumentKind, 'type-1' | 'type-2'>> = {
  'dft-gauge-type1': 'type-1',
  'dft-gauge-type2': 'type-2',
}

function invalid(field: string, message: string) {
  return new HttpError(400, 'invalid_input', `${field}: ${message}`, [{ field, message }])
}

/**
 * PUT /api/parts/:id/sections/:section: appends a record (nothing is overwritten; the latest of
 * the round is current) and recomputes the verdict. A replayed clientId answers the part as is.
 */
export async function recordSection(
  actor: AuditActor,
  partId: number,
  section: SectionName,
  body: { clientId: string; instrumentId: number | null; data: unknown },
): Promise<PartDetail> {
  const parsed = sectionDataSchemas[section].safeParse(body.data)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    throw invalid(['body', 'data', ...issue.path.map(String)].join('.'), issue.message)
  }
  return inTransaction(async (t) => {
    const replay = await SectionRecord.findOne({
      where: { clientId: body.clientId },
      transaction: t,
    })
    if (replay) {
      if (replay.partId !== partId)
        throw conflict(
          'client_id_reused',
          'This clientId already belongs to a record of another part',
        )
      return getPartDetail(partId, t)
    }
    const part = await lockPartForWrite(partId, t)
    assertLotOpen({ lotNumber: part.lotNumber, status: part.lotStatus }, 'before records are added')
    const kinds = SECTION_INSTRUMENT_KINDS[section]
    if (body.instrumentId !== null) {
      if (kinds.length === 0)
        throw invalid('body.instrumentId', `The ${section} section takes no instrument`)
      const instrument = await assertInstrumentUsable(body.instrumentId, kinds, new Date(), t)
      const gaugeType = (parsed.data as { gaugeType?: string }).gaugeType
      const expected = GAUGE_TYPE_OF_KIND[instrument.kind]
      if (section === 'thickness-gauge' && expected && gaugeType !== expected) {
        throw invalid(
          'body.data.gaugeType',
          `Instrument ${instrument.serial} is a ${expected} gauge, not ${gaugeType}`,
        )
      }
    }
    const record = await SectionRecord.create(
      {
        partId,
        round: part.round,
        section,
        data: parsed.data,
        instrumentId: body.instrumentId,
        recordedBy: actor.id,
        clientId: body.clientId,
      },
      { transaction: t },
    )
    const verdict = await recomputePartVerdict(part.spec, part, t)
    await recordAudit(t, actor, {
      action: 'section.record',
      entityType: 'part',
      entityId: partId,
      lotId: part.lotId,
      after: {
        section,
        round: part.round,
        recordId: record.id,
        instrumentId: body.instrumentId,
        data: parsed.data,
        verdictStatus: verdict.status,
      },
    })
    return getPartDetail(partId, t)
  })
}
