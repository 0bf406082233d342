import type { z } from 'zod'
import { AuditEvent } from '../../../server/db/models'
import type { specContentSchema } from '../../../shared/spec/specContent'

type SpecContentInput = z.input<typeof specContentSchema>

/** An FBE spec body: 12–20 mils (304.8–508 µm) by SSPC-PA 2 level 3 — the common band [P]. */
export function fbeContent(overrides: Partial<SpecContentInput> = {}): SpecContentInput {
  return {
    coatingType: 'FBE',
    thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 304.8, maxUm: 508, pa2Level: 3 },
    surfacePrep: {
      grade: 'SSPC-SP10/Sa2.5',
      profileMethod: 'C-replica-tape',
      profileMinUm: 38,
      profileMaxUm: 100,
    },
    climate: {},
    holiday: { method: 'high-voltage', voltageRule: 'NACE-SP0490' },
    cure: { dsc: { minDeltaTgC: -2, maxDeltaTgC: 3 } },
    adhesion: { crossCut: { method: 'A', minGrade: 5 } },
    sampling: {},
    ...overrides,
  }
}

/** The audit events for one record, oldest first. */
export function auditFor(entityType: string, entityId: number | string) {
  return AuditEvent.findAll({
    where: { entityType, entityId: String(entityId) },
    order: [['id', 'ASC']],
  })
}

export function fieldsOf(body: { error?: { details?: { field: string }[] } }): string[] {
  return (body.error?.details ?? []).map((d) => d.field)
}
