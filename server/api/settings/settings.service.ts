import type { Transaction } from 'sequelize'
import { inTransaction } from '../../db'
import { Setting } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { DEFAULT_SETTINGS, settingsSchema, type PlantSettings } from '../../../shared/api/setup'

export const PLANT_SETTINGS_KEY = 'plant'

/**
 * The plant's settings; defaults for whatever was never saved. A stored value that no longer
 * fits the schema (an older release's shape) falls back field by field rather than failing.
 */
export async function getPlantSettings(t?: Transaction): Promise<PlantSettings> {
  const row = await Setting.findByPk(PLANT_SETTINGS_KEY, { transaction: t })
  const stored = (row?.value ?? {}) as Record<string, unknown>
  const merged = { ...DEFAULT_SETTINGS }
  for (const key of Object.keys(DEFAULT_SETTINGS) as (keyof PlantSettings)[]) {
    const field = settingsSchema.shape[key].safeParse(stored[key])
    if (field.success) Object.assign(merged, { [key]: field.data })
  }
  return merged
}

export async function updatePlantSettings(
  actor: AuditActor,
  body: PlantSettings,
): Promise<PlantSettings> {
  return inTransaction(async (t) => {
    const row = await Setting.findByPk(PLANT_SETTINGS_KEY, { lock: t.LOCK.UPDATE, transaction: t })
    const before = await getPlantSettings(t)
    const value: PlantSettings = {
      allowRecorderToRelease: body.allowRecorderToRelease,
      plantName: body.plantName,
      plantAddress: body.plantAddress,
    }
    if (row) await row.update({ value }, { transaction: t })
    else await Setting.create({ key: PLANT_SETTINGS_KEY, value }, { transaction: t })
    await recordAudit(t, actor, {
      action: 'settings.update',
      entityType: 'setting',
      entityId: PLANT_SETTINGS_KEY,
      before,
      after: value,
    })
    return getPlantSettings(t)
  })
}
