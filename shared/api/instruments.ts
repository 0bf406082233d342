export const INSTRUMENT_KINDS = [
  'dft-gauge-type1',
  'dft-gauge-type2',
  'holiday-low-voltage',
  'holiday-high-voltage',
  'profile-gauge',
  'replica-tape-micrometer',
  'surface-thermometer',
  'hygrometer',
  'oven-recorder',
] as const
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number]

export const INSTRUMENT_KIND_LABELS: Record<InstrumentKind, string> = {
  'dft-gauge-type1': 'DFT gauge, Type 1 (magnetic pull-off, ASTM D7091)',
  'dft-gauge-type2': 'DFT gauge, Type 2 (electronic, ASTM D7091)',
  'holiday-low-voltage': 'Holiday tester, low-voltage wet sponge (ASTM D5162 Method A)',
  'holiday-high-voltage': 'Holiday tester, high-voltage spark (ASTM D5162 Method B)',
  'profile-gauge': 'Profile depth micrometer (ASTM D4417 Method B)',
  'replica-tape-micrometer': 'Replica tape micrometer (ASTM D4417 Method C)',
  'surface-thermometer': 'Surface (steel) thermometer',
  hygrometer: 'Hygrometer / psychrometer',
  'oven-recorder': 'Oven temperature recorder',
}

/** Days before the due date at which an instrument shows as "due soon". */
export const CALIBRATION_WARNING_DAYS = 30
