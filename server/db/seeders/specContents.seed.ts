import { specContentSchema, type SpecContent } from '../../../shared/spec/specContent'

/**
 * The demo plant's coating specs. Tags as in TRADE.md: [R] read in the source named,
 * [M] from memory (a spec field, so a real spec overrides it), [P] common shop practice,
 * [D] a demo choice of ours with no source (an invented powder or paint data sheet).
 * Thickness is stored in µm; 1 mil = 25.4 µm exactly, so 12 mils = 304.8 µm.
 */
const MIL = 25.4

/** FBE on valve bodies and fittings, the plant's own standard. */
const fbeValvesAndFittings = {
  coatingType: 'FBE',
  // 12–20 mils is a common band for FBE on valves and fittings [P]; PA 2 level 3 is the
  // level PA 2 applies when a spec names none [M].
  thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 12 * MIL, maxUm: 20 * MIL, pa2Level: 3 },
  // SP 10 / Sa 2½ and a 1.5–4 mil (38–100 µm) profile are what FBE usually wants [M].
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 38,
    profileMaxUm: 100,
  },
  // Steel ≥ 3 °C above the dew point and RH ≤ 85 % (ISO 8502-4 guidance, ISO 12944-7) [R].
  climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
  // Spark test at 525 √T (NACE SP0490, T in mils) [M]; the spec asks for the spark test on FBE
  // whatever the D5162 thickness split says. ±5 % on the voltage is shop practice [P].
  holiday: {
    required: true,
    method: 'high-voltage',
    voltageRule: 'NACE-SP0490',
    voltageTolerancePct: 5,
  },
  cure: {
    // DSC by the CSA Z245.20 method [R]; the −2 to +3 °C ΔTg window is [M].
    dsc: { minDeltaTgC: -2, maxDeltaTgC: 3 },
    // Roughly 205 °C (400 °F) part temperature [P]; the 200–245 °C / 2–10 min window stands in
    // for the (invented) powder maker's data sheet [D].
    oven: { minTempC: 200, maxTempC: 245, minMinutes: 2, maxMinutes: 10 },
  },
  adhesion: {
    // ASTM D3359 limits the cross-cut (method B) to films up to 5 mils; at 12–20 mils the
    // X-cut (method A) applies [R], so this spec asks for 5A, no peeling [D].
    crossCut: { method: 'A', minGrade: 5 },
    // ASTM D6677 knife adhesion, 0–10 scale [R]; a minimum of 8 is [D].
    knife: { minRating: 8 },
  },
  sampling: { mode: 'every-part' },
  notes: 'Plant standard for FBE on ductile-iron valve bodies, covers and fittings.',
}

/** Ashvale Water Board's own FBE spec: tighter, PA 2 level 2 (no spot below the minimum). */
const ashvaleFbe = {
  ...fbeValvesAndFittings,
  // A single-layer FBE is typically 14–16 mils [R]; the buyer's 12–16 mil band is [D].
  // Level 2: spots 100 % of min to 120 % of max [M].
  thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 12 * MIL, maxUm: 16 * MIL, pa2Level: 2 },
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 50,
    profileMaxUm: 100,
  },
  notes:
    'Ashvale Water Board, interior and exterior of valves for drinking water. The powder must hold ' +
    'an NSF/ANSI/CAN 61 listing (stated on the certificate; Filmtrail certifies nothing itself).',
}

/** Two-part liquid epoxy by ISO 19840, for fittings too large or too heat-sensitive for FBE. */
const liquidEpoxy300 = {
  coatingType: 'liquid-epoxy',
  // ISO 19840: NDFT 300 µm with the 80/20 rule [R]; a maximum of 3 × NDFT is often used [R].
  // Gauges are adjusted on a blasted reference here, so no profile correction [D].
  thickness: {
    rule: 'ISO-19840',
    bandUnit: 'um',
    minUm: 300,
    maxUm: 900,
    isoAllowExactly20Pct: false,
    isoProfileCorrectionUm: 0,
  },
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 50,
    profileMaxUm: 100,
  },
  climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
  // D5162: wet sponge up to 500 µm, spark above [R]. Sponge at 67.5 V [M]; spark by
  // NACE SP0274's 525 √T below 40 mils [M].
  holiday: {
    required: true,
    method: 'by-thickness',
    voltageRule: 'NACE-SP0274',
    fixedVoltageV: 67.5,
    voltageTolerancePct: 5,
  },
  // ASTM D5402 leaves solvent, rub count and pass mark to the spec [R]: MEK, 50 double rubs [D].
  cure: { solventRub: { solvent: 'MEK', minDoubleRubs: 50 } },
  // ASTM D4541 pull-off [R]; the 5 MPa minimum is [D].
  adhesion: { pullOff: { minMPa: 5 } },
  sampling: { mode: 'every-part' },
  notes:
    'Two-part amine-cured epoxy, airless spray in the liquid-epoxy booth; days to full cure [P].',
}

/** A shop primer on pipe spools for the industrial contractor, who tests three per lot. */
const contractorPrimer = {
  coatingType: 'primer',
  // ISO 19840 applies from NDFT 40 µm [R]; NDFT 75 µm, max 225 µm (3 × NDFT) [D].
  thickness: { rule: 'ISO-19840', bandUnit: 'um', minUm: 75, maxUm: 225 },
  // Commercial blast SP 6 / Sa 2 [R]; 25–50 µm profile by depth micrometer [D].
  surfacePrep: {
    grade: 'SSPC-SP6/Sa2',
    profileMethod: 'B-depth-micrometer',
    profileMinUm: 25,
    profileMaxUm: 50,
  },
  climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
  holiday: { required: false },
  cure: {},
  // A 3 mil film is inside the cross-cut's 5 mil limit, so ASTM D3359 method B, 5B [R scope, D grade].
  adhesion: { crossCut: { method: 'B', minGrade: 5 } },
  sampling: { mode: 'sample', sampleSize: 3 },
  notes: 'Holding primer only; the contractor applies the finish coat on site.',
}

export interface DemoSpec {
  code: string
  title: string
  customerCode: string | null
  content: SpecContent
}

/** Parsed through the same schema the API uses, so a seed spec can never be one the forms refuse. */
export const DEMO_SPECS: DemoSpec[] = [
  {
    code: 'HFW-FBE-01',
    title: 'FBE on valves and fittings, 12–20 mils',
    customerCode: null,
    content: specContentSchema.parse(fbeValvesAndFittings),
  },
  {
    code: 'AWB-FBE-2',
    title: 'Ashvale Water Board — FBE for potable-water valves',
    customerCode: 'AWB',
    content: specContentSchema.parse(ashvaleFbe),
  },
  {
    code: 'HFW-LE-300',
    title: 'Liquid epoxy, NDFT 300 µm (ISO 19840)',
    customerCode: null,
    content: specContentSchema.parse(liquidEpoxy300),
  },
  {
    code: 'OPC-PR-75',
    title: 'Ostmere — holding primer on spools, NDFT 75 µm',
    customerCode: 'OPC',
    content: specContentSchema.parse(contractorPrimer),
  },
]
