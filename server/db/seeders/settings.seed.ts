import { Setting } from '../models'
import { DEFAULT_SETTINGS, type PlantSettings } from '../../../shared/api/setup'
import { PLANT_SETTINGS_KEY } from '../../api/settings/settings.service'
import { auditSeed, count, type Seeder } from './seeder'

/** The invented plant. Its two coating lines and three shifts, for the seeders of lots that follow. */
export const DEMO_LINES = [
  { code: 'FBE-1', name: 'FBE powder line (preheat, electrostatic booth, cure oven)' },
  { code: 'LE-1', name: 'Liquid-epoxy booth (two-part, airless spray)' },
] as const
export const DEMO_SHIFTS = [
  { code: 'A', name: 'Early shift, 06:00–14:00' },
  { code: 'B', name: 'Late shift, 14:00–22:00' },
  { code: 'C', name: 'Night shift, 22:00–06:00' },
] as const

const plant: PlantSettings = {
  ...DEFAULT_SETTINGS,
  plantName: 'Harrowgate Flow Works — Coating Shop',
  plantAddress: 'Coating Shop, Bay 3, 12 Foundry Lane, Harrowgate (a fictional address)',
}

export const settingsSeeder: Seeder = {
  name: 'settings',
  async run(ctx) {
    const existing = await Setting.findByPk(PLANT_SETTINGS_KEY, { transaction: ctx.t })
    count(ctx, 'plant settings', !existing)
    if (existing) return
    await Setting.create({ key: PLANT_SETTINGS_KEY, value: plant }, { transaction: ctx.t })
    await auditSeed(ctx, 'setting', PLANT_SETTINGS_KEY, plant)
  },
}
