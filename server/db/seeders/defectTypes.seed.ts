import { DefectType } from '../models'
import { DEFAULT_DEFECT_TYPES } from '../../api/defect-types/defaultDefectTypes'
import { auditSeed, count, type Seeder } from './seeder'

/** The starting list of defect types, by code; an admin's later changes to the list are kept. */
export const defectTypesSeeder: Seeder = {
  name: 'defect-types',
  async run(ctx) {
    for (const d of DEFAULT_DEFECT_TYPES) {
      const existing = await DefectType.findOne({ where: { code: d.code }, transaction: ctx.t })
      count(ctx, 'defect types', !existing)
      if (existing) continue
      const created = await DefectType.create(
        { code: d.code, label: d.label },
        { transaction: ctx.t },
      )
      await auditSeed(ctx, 'defect-type', created.id, {
        id: created.id,
        code: d.code,
        label: d.label,
        active: true,
      })
    }
  },
}
