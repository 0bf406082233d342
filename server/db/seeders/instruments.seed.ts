import { Instrument } from '../models'
import { addDays } from '../../../shared/api/calibration'
import type { InstrumentKind } from '../../../shared/api/instruments'
import { auditSeed, count, type Seeder } from './seeder'

interface DemoInstrument {
  kind: InstrumentKind
  serial: string
  description: string
  /** Calibration due, in days from the first seed run; calibrated a year before that. */
  dueInDays: number
  certificateRef: string
}

/**
 * One instrument of every kind (fictional serials), plus a second DFT gauge. One is due within
 * 30 days and one is overdue, so Setup → Instruments shows each state from the first start.
 */
export const DEMO_INSTRUMENTS: DemoInstrument[] = [
  {
    kind: 'dft-gauge-type2',
    serial: 'HFW-DFT2-0417',
    description: 'FBE line gauge, probe F',
    dueInDays: 160,
    certificateRef: 'CAL-HFW-1107',
  },
  {
    kind: 'dft-gauge-type2',
    serial: 'HFW-DFT2-0523',
    description: 'Liquid booth gauge',
    dueInDays: 12,
    certificateRef: 'CAL-HFW-1042',
  },
  {
    kind: 'dft-gauge-type1',
    serial: 'HFW-DFT1-0088',
    description: 'Pencil-type pull-off gauge (referee)',
    dueInDays: 240,
    certificateRef: 'CAL-HFW-1120',
  },
  {
    kind: 'holiday-high-voltage',
    serial: 'HFW-HV-0031',
    description: 'Spark tester, 0.5–15 kV',
    dueInDays: 95,
    certificateRef: 'CAL-HFW-1090',
  },
  {
    kind: 'holiday-low-voltage',
    serial: 'HFW-LV-0014',
    description: 'Wet-sponge tester',
    dueInDays: 200,
    certificateRef: 'CAL-HFW-1101',
  },
  {
    kind: 'profile-gauge',
    serial: 'HFW-PRF-0206',
    description: 'Depth micrometer, flat-base probe',
    dueInDays: 130,
    certificateRef: 'CAL-HFW-1077',
  },
  {
    kind: 'replica-tape-micrometer',
    serial: 'HFW-RTM-0119',
    description: 'Spring micrometer for replica tape',
    dueInDays: 300,
    certificateRef: 'CAL-HFW-1133',
  },
  {
    kind: 'surface-thermometer',
    serial: 'HFW-STH-0342',
    description: 'Magnetic surface thermometer',
    dueInDays: 75,
    certificateRef: 'CAL-HFW-1066',
  },
  {
    kind: 'hygrometer',
    serial: 'HFW-HYG-0057',
    description: 'Electronic hygrometer, booth',
    dueInDays: -6,
    certificateRef: 'CAL-HFW-0981',
  },
  {
    kind: 'oven-recorder',
    serial: 'HFW-OVN-0009',
    description: 'Six-channel cure-oven recorder',
    dueInDays: 45,
    certificateRef: 'CAL-HFW-1055',
  },
]

export const instrumentsSeeder: Seeder = {
  name: 'instruments',
  async run(ctx) {
    for (const i of DEMO_INSTRUMENTS) {
      const existing = await Instrument.findOne({ where: { serial: i.serial }, transaction: ctx.t })
      count(ctx, 'instruments', !existing)
      if (existing) continue
      const calibrationDueOn = addDays(ctx.today, i.dueInDays)
      const instrument = await Instrument.create(
        {
          kind: i.kind,
          serial: i.serial,
          description: i.description,
          calibratedOn: addDays(calibrationDueOn, -365),
          calibrationDueOn,
          certificateRef: i.certificateRef,
        },
        { transaction: ctx.t },
      )
      await auditSeed(ctx, 'instrument', instrument.id, instrument)
    }
  },
}
