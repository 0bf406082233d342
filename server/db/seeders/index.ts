import { inTransaction, sequelize } from '../index'
import { Setting } from '../models'
import { localIsoDate } from '../../../shared/api/calibration'
import type { SeedContext, Seeder } from './seeder'
import { settingsSeeder } from './settings.seed'
import { customersSeeder } from './customers.seed'
import { usersSeeder } from './users.seed'
import { specsSeeder } from './specs.seed'
import { instrumentsSeeder } from './instruments.seed'
import { floorHistorySeeder } from './floorHistory.seed'
import { defectTypesSeeder } from './defectTypes.seed'
import { reviewHistorySeeder } from './reviewHistory.seed'
import { certificatesSeeder } from './certificates.seed'

export { DEMO_SIGN_INS, type DemoSignIn } from './users.seed'
export { DEMO_LINES, DEMO_SHIFTS } from './settings.seed'
export { DEMO_PASSWORD } from './demoPassword'

/**
 * The demo seed for Harrowgate Flow Works, in order (customers before the customer user and the
 * customers' specs). Later features append their own seeders (e.g. months of lots) here.
 */
export const SEEDERS: Seeder[] = [
  settingsSeeder,
  customersSeeder,
  usersSeeder,
  specsSeeder,
  instrumentsSeeder,
  floorHistorySeeder,
  defectTypesSeeder,
  reviewHistorySeeder,
  certificatesSeeder,
]

/** Which `once` seeders have run, and when; kept in the settings table. */
export const SEED_MARKER_KEY = 'seed'
type SeedMarker = {
  runs: number
  firstRunAt: string
  lastRunAt: string
  once: Record<string, string>
}

export interface SeedSummary {
  today: string
  tally: SeedContext['tally']
  skipped: string[]
}

/**
 * Runs every seeder in one transaction (all or nothing) under an advisory lock, so two starts
 * at once cannot seed twice. Safe to run again: see Seeder.
 */
export async function runSeed(
  seeders: Seeder[] = SEEDERS,
  today: string = localIsoDate(),
): Promise<SeedSummary> {
  return inTransaction(async (t) => {
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext('filmtrail-demo-seed'))", {
      transaction: t,
    })
    const markerRow = await Setting.findByPk(SEED_MARKER_KEY, { transaction: t })
    const now = new Date().toISOString()
    const marker: SeedMarker = (markerRow?.value as SeedMarker | undefined) ?? {
      runs: 0,
      firstRunAt: now,
      lastRunAt: now,
      once: {},
    }
    const ctx: SeedContext = { t, today, tally: {} }
    const skipped: string[] = []
    for (const seeder of seeders) {
      if (seeder.once && marker.once[seeder.name]) {
        skipped.push(seeder.name)
        continue
      }
      await seeder.run(ctx)
      if (seeder.once) marker.once[seeder.name] = now
    }
    const value: SeedMarker = { ...marker, runs: marker.runs + 1, lastRunAt: now }
    if (markerRow) await markerRow.update({ value }, { transaction: t })
    else await Setting.create({ key: SEED_MARKER_KEY, value }, { transaction: t })
    return { today, tally: ctx.tally, skipped }
  })
}
