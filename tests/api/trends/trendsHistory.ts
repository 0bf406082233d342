import { sequelize } from '../../../server/db'
import {
  defectType,
  holidayRecord,
  lot,
  nonconformance,
  people,
  spec,
  type PartSpec,
} from './trendsFixture'

/**
 * The hand-made history the trend tests check, in the ISO weeks W10 (Mon 2026-03-02) and W11
 * (Mon 2026-03-09):
 *   L1  W10, FBE line, shift 1, spec TA-1 (300–500 µm), customer 1, 10 parts, 0.5 m² each:
 *       means 400 410 390 420 380 | 350 360 340 370 330; the third (390) fails (holiday)
 *   L2  W11, FBE line, shift 3, TA-1, customer 1, 7 parts, 1.0 m² × quantity 2:
 *       means 450 470 430 460 440 | 290 505; 470 is incomplete, 290 and 505 fail (thickness)
 *   L3  W11, liquid-epoxy booth, shift 2, spec TB-1 (75–225), customer 2, family FT:
 *       100 110 120 pass, no area; plus one part not sampled (never counted)
 *   L4  2026-02-02, TA-1: one part outside the period
 *   L5  2026-05-05, spec TC-1 (90–120), 18 parts in pairs for the control-chart rules
 */
export const PERIOD = 'from=2026-03-02&to=2026-03-15'
export const TA_VALUES = [
  400, 410, 390, 420, 380, 350, 360, 340, 370, 330, 450, 470, 430, 460, 440, 290, 505,
]

const pass = (meanUm: number, extra: Partial<PartSpec> = {}): PartSpec => ({
  meanUm,
  status: 'pass',
  ...extra,
})

export async function buildHistory() {
  const { userId, c1, c2 } = await people()
  const specA = await spec('TA-1', 300, 500)
  const specB = await spec('TB-1', 75, 225)
  const specC = await spec('TC-1', 90, 120)
  const a = { areaM2: 0.5 }
  const L1 = await lot({
    at: '2026-03-03T07:00:00Z',
    specId: specA,
    customerId: c1,
    userId,
    line: 'fbe-powder',
    shift: '1',
    parts: [
      pass(400, a),
      pass(410, a),
      { meanUm: 390, status: 'fail', failing: ['holiday'], ...a },
      pass(420, a),
      pass(380, a),
      pass(350, a),
      pass(360, a),
      pass(340, a),
      pass(370, a),
      pass(330, a),
    ],
  })
  const b = { areaM2: 1.0, quantity: 2 }
  const L2 = await lot({
    at: '2026-03-10T23:00:00Z',
    specId: specA,
    customerId: c1,
    userId,
    line: 'fbe-powder',
    shift: '3',
    parts: [
      pass(450, b),
      { meanUm: 470, status: 'incomplete', ...b },
      pass(430, b),
      pass(460, b),
      pass(440, b),
      { meanUm: 290, status: 'fail', failing: ['thickness'], ...b },
      { meanUm: 505, status: 'fail', failing: ['thickness'], ...b },
    ],
  })
  const L3 = await lot({
    at: '2026-03-11T15:00:00Z',
    specId: specB,
    customerId: c2,
    userId,
    line: 'liquid-epoxy',
    shift: '2',
    partNumber: 'FT-200-MJ',
    parts: [
      pass(100),
      pass(110),
      pass(120),
      { meanUm: null, status: 'incomplete', sampled: false },
    ],
  })
  await lot({
    at: '2026-02-02T08:00:00Z',
    specId: specA,
    customerId: c1,
    userId,
    parts: [pass(1000)],
  })
  // Pairs (m − 1, m + 1): range 2 each; subgroup means 100 ×7, then 104, 104.
  const pairs = [100, 100, 100, 100, 100, 100, 100, 104, 104].flatMap((m) => [
    pass(m - 1),
    pass(m + 1),
  ])
  await lot({
    at: '2026-05-05T09:00:00Z',
    specId: specC,
    customerId: c2,
    userId,
    shift: '2',
    partNumber: 'SP-300-PE',
    parts: pairs,
  })

  // Holidays at round 1: L1 all tested (2 found, 1 open, on 390; 1 found on 420); L2's first
  // part has two records — 3 found, then a correction with 1: the newest counts.
  for (const [i, id] of L1.partIds.entries())
    await holidayRecord(id, userId, i === 2 ? 2 : i === 3 ? 1 : 0, i === 2 ? 1 : 0)
  await holidayRecord(L2.partIds[0]!, userId, 3)
  await holidayRecord(L2.partIds[0]!, userId, 1)

  const thin = await defectType('thin-film-t', 'Film below minimum DFT')
  const holiday = await defectType('holiday-open-t', 'Holiday not repaired')
  const damage = await defectType('handling-t', 'Handling damage')
  await nonconformance(L1.lotId, [L1.partIds[2]!], holiday, userId)
  await nonconformance(L2.lotId, [L2.partIds[5]!, L1.partIds[9]!], thin, userId)
  await nonconformance(L1.lotId, [L1.partIds[0]!], damage, userId)

  // A description that would run as a spreadsheet formula and holds a comma and quotes.
  await sequelize.query(`UPDATE parts SET description = '=HYPERLINK("x"), tee' WHERE id = $1`, {
    bind: [L3.partIds[0]],
  })
  return { userId, c1, c2, specA, specB, specC, L1, L2, L3 }
}
