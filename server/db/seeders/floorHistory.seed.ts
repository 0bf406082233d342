import { CoatingSpec, Customer, Instrument, User } from '../models'
import { addDays } from '../../../shared/api/calibration'
import type { Line, Shift } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { lockSpecVersion } from '../../api/specs/specs.service'
import { specContentFor } from '../../api/lots/specCache'
import { lotNumberPrefix, reserveLotNumbers } from '../../api/lots/lotNumber'
import { prng, SHIFT_START_HOUR } from './floorHistory.plan'
import { fillParts, planLots } from './floorHistory.lots'
import { insertMany, writeParts } from './floorHistory.write'
import type { Seeder } from './seeder'

/**
 * Sixteen weeks of shop-floor history for the invented plant, once per database: lots on both
 * lines and three shifts, repairs, a lot awaiting review with a failing part, two open lots.
 * Deterministic (seeded PRNG); every verdict comes from the server's own verdict function.
 */
const SEED = 20260415

export const floorHistorySeeder: Seeder = {
  name: 'floor-history',
  once: true,
  async run(ctx) {
    const { t, today } = ctx
    const rng = prng(SEED)
    const customers = new Map((await Customer.findAll({ transaction: t })).map((c) => [c.code, c]))
    const specs = new Map((await CoatingSpec.findAll({ transaction: t })).map((s) => [s.code, s]))
    const instruments = new Map(
      (await Instrument.findAll({ transaction: t })).map((i) => [i.serial, i]),
    )
    const operator = await User.findOne({
      where: { email: 'operator@harrowgate.example' },
      transaction: t,
    })
    const supervisor = await User.findOne({
      where: { email: 'supervisor@harrowgate.example' },
      transaction: t,
    })
    if (!operator || !supervisor)
      throw new Error('Seed order: the demo users must come before the floor history')
    const contents = new Map<string, { specId: number; version: number; content: SpecContent }>()
    for (const code of ['HFW-FBE-01', 'AWB-FBE-2', 'HFW-LE-300', 'OPC-PR-75']) {
      const spec = specs.get(code)
      if (!spec)
        throw new Error(`Seed order: coating spec ${code} must come before the floor history`)
      const v = await lockSpecVersion(spec.id, spec.currentVersion, t)
      contents.set(code, {
        specId: spec.id,
        version: v.version,
        content: await specContentFor(spec.id, v.version, t),
      })
    }
    const serialId = (serial: string | null) => {
      if (serial === null) return null
      const i = instruments.get(serial)
      if (!i) throw new Error(`Seed order: instrument ${serial} must come before the floor history`)
      return i.id
    }

    const lots = planLots(rng, today)
    for (const lot of lots) fillParts(rng, lot, contents.get(lot.specCode)!.content)
    const lotRows: unknown[][] = []
    const openedAt = lots.map(
      (lot) => new Date(`${lot.day}T${String(SHIFT_START_HOUR[lot.shift]).padStart(2, '0')}:40:00`),
    )
    // Numbers in opening order, reserved per line and week in one statement each.
    const byPrefix = new Map<string, number[]>()
    lots.forEach((lot, i) => {
      const key = lotNumberPrefix(lot.line as Line, openedAt[i]!)
      byPrefix.set(key, [...(byPrefix.get(key) ?? []), i])
    })
    const lotNumbers: string[] = []
    for (const indexes of byPrefix.values()) {
      const first = indexes[0]!
      const numbers = await reserveLotNumbers(
        lots[first]!.line as Line,
        openedAt[first]!,
        indexes.length,
        t,
      )
      indexes.forEach((lotIndex, k) => (lotNumbers[lotIndex] = numbers[k]!))
    }
    for (const [i, lot] of lots.entries()) {
      const at = openedAt[i]!
      const s = contents.get(lot.specCode)!
      const batch =
        lot.line === 'fbe-powder'
          ? `PB-${2200 + Math.floor(rng.between(0, 90))}`
          : `LE-${5100 + Math.floor(rng.between(0, 60))}`
      lotRows.push([
        lotNumbers[i],
        customers.get(lot.customerCode)!.id,
        `PO-${lot.customerCode}-${Math.floor(rng.between(40000, 99999))}`,
        s.specId,
        s.version,
        lot.line,
        lot.shift as Shift,
        lot.line === 'fbe-powder'
          ? 'Harrowmark FBE 7-200, green (fictional)'
          : 'Two-part amine epoxy HX-300, buff (fictional)',
        batch,
        addDays(lot.day, 200),
        lot.status,
        operator.id,
        crypto.randomUUID(),
        at,
        at,
      ])
    }
    const lotIds = await insertMany(
      t,
      'lots',
      [
        'lot_number',
        'customer_id',
        'order_ref',
        'spec_id',
        'spec_version',
        'line',
        'shift',
        'coating_material',
        'batch_number',
        'batch_expires_on',
        'status',
        'opened_by',
        'client_id',
        'created_at',
        'updated_at',
      ],
      lotRows,
      'id, lot_number',
    )
    await writeParts(t, ctx, lots, lotIds, openedAt, contents, serialId, operator.id, supervisor.id)
  },
}
