/**
 * API steps of the journeys: what happens off-screen between one person's pages and the next.
 * The line tablet records every section by touch in tests/e2e/floor; here the sections the
 * journey does not type are copied from a released demo part of the same spec (seed), so the
 * part's verdict is the server's own and not a value written into the test.
 */
import { expect } from 'vitest'
import type { LotDetail, PartDetail, SectionName } from '../../../shared/api/lots'
import { api } from '../review/reviewSteps'

export { api, apiToken } from '../review/reviewSteps'

// HFW-FBE-01 (seed): SSPC-PA 2, 12–20 mil = 304.8–508 µm. 0.5 m² is one area of 5 spots × 3
// readings (SSPC-PA 2 small part rule [R]). Spot means 380–420 µm are in the band.
export const SPEC_CODE = 'HFW-FBE-01'
export const PASSING_SPOTS_UM = [
  [380, 385, 390],
  [400, 402, 398],
  [410, 415, 405],
  [395, 390, 392],
  [420, 418, 416],
]
// Spot means near 250 µm: below the 304.8 µm minimum, so thickness fails and the submission
// opens an automatic nonconformance.
export const THIN_SPOTS_UM = [
  [250, 255, 248],
  [260, 252, 258],
  [245, 250, 255],
  [262, 258, 260],
  [250, 248, 252],
]

interface Template {
  sections: Map<SectionName, { instrumentId: number | null; data: unknown }>
}

/** The round-1 records of a passing part on a released lot of the spec, from the demo seed. */
export async function templatePart(token: string): Promise<Template> {
  const lots = (await api<LotDetail[]>(token, 'GET', '/api/lots?status=released')).data
  // Oldest first: the newest released lots may be this run's own, released on concession.
  for (const lot of lots.filter((l) => l.specCode === SPEC_CODE).reverse()) {
    const detail = (await api<LotDetail>(token, 'GET', `/api/lots/${lot.id}`)).data
    for (const p of detail.parts) {
      const part = (await api<PartDetail>(token, 'GET', `/api/parts/${p.id}`)).data
      if (part.verdict?.status !== 'pass' || part.round !== 1) continue
      const sections = new Map<SectionName, { instrumentId: number | null; data: unknown }>()
      for (const s of Object.values(part.sections)) {
        if (s) sections.set(s.section, { instrumentId: s.instrumentId, data: s.data })
      }
      return { sections }
    }
  }
  throw new Error(`the seed has no passing round-1 part on a released ${SPEC_CODE} lot`)
}

export async function putSection(
  token: string,
  partId: number,
  section: SectionName,
  data: unknown,
  instrumentId: number | null,
): Promise<PartDetail> {
  const r = await api<PartDetail>(token, 'PUT', `/api/parts/${partId}/sections/${section}`, {
    clientId: crypto.randomUUID(),
    instrumentId,
    data,
  })
  expect(r.status, `${section}: ${JSON.stringify(r.data)}`).toBeLessThan(300)
  return r.data
}

/** The sections copied from the template, leaving out those the browser records. */
export async function copySections(
  token: string,
  partId: number,
  t: Template,
  skip: SectionName[],
) {
  for (const s of ['surface-prep', 'climate', 'thickness-gauge', 'cure', 'adhesion'] as const) {
    const rec = t.sections.get(s)
    if (rec && !skip.includes(s)) await putSection(token, partId, s, rec.data, rec.instrumentId)
  }
}

/**
 * The holiday test at the voltage the verdict asks for: NACE SP0490 sets it from the measured
 * film thickness, so it is read back from the server, not guessed. No holidays found.
 */
export async function recordHoliday(token: string, partId: number, t: Template) {
  const mid = (await api<PartDetail>(token, 'GET', `/api/parts/${partId}`)).data
  const holiday = mid.verdict!.criteria.find((c) => c.criterion === 'holiday')!
  const requiredV = Number(holiday.numbers.requiredVoltageV)
  const h = t.sections.get('holiday')!
  return putSection(
    token,
    partId,
    'holiday',
    { ...(h.data as object), voltageUsedV: Math.ceil(requiredV), holidays: [] },
    h.instrumentId,
  )
}

export async function postReadings(
  token: string,
  partId: number,
  gaugeId: number,
  spotsUm: number[][],
) {
  const readings = spotsUm.flatMap((spot, i) =>
    spot.map((thicknessUm) => ({
      clientId: crypto.randomUUID(),
      areaNo: 1,
      spotNo: i + 1,
      thicknessUm,
      instrumentId: gaugeId,
    })),
  )
  const r = await api(token, 'POST', `/api/parts/${partId}/readings`, { readings })
  expect(r.status).toBe(201)
}

/**
 * A lot for Ashvale Water Board with one thin part, fully recorded and sent to review by the
 * operator (own token): the supervisor's journey starts from its automatic nonconformance.
 */
export async function thinLotInReview(opToken: string, t: Template, tag: string) {
  const specs = (await api<{ id: number; code: string }[]>(opToken, 'GET', '/api/specs')).data
  const customers = (await api<{ id: number; name: string }[]>(opToken, 'GET', '/api/customers'))
    .data
  const made = await api<LotDetail>(opToken, 'POST', '/api/lots', {
    clientId: crypto.randomUUID(),
    customerId: customers.find((c) => c.name === 'Ashvale Water Board')!.id,
    orderRef: `PO-JOURNEY-${tag}`,
    specId: specs.find((s) => s.code === SPEC_CODE)!.id,
    line: 'fbe-powder',
    shift: '1',
    coatingMaterial: 'Harrowmark FBE 7-200, green (fictional)',
    batchNumber: `PB-J-${tag}`,
    batchExpiresOn: '2031-01-31',
    parts: [
      {
        clientId: crypto.randomUUID(),
        partNumber: `VB-THIN-${tag}`,
        heatNumber: `HT-THIN-${tag}`,
        coatedAreaM2: 0.5,
      },
    ],
  })
  expect(made.status, JSON.stringify(made.data)).toBe(201)
  const lot = made.data
  const partId = lot.parts[0]!.id
  await copySections(opToken, partId, t, [])
  await postReadings(
    opToken,
    partId,
    t.sections.get('thickness-gauge')!.instrumentId!,
    THIN_SPOTS_UM,
  )
  const part = await recordHoliday(opToken, partId, t)
  expect(part.verdict?.status).toBe('fail')
  const sent = await api<LotDetail>(opToken, 'POST', `/api/lots/${lot.id}/submit`, {})
  expect(sent.status, JSON.stringify(sent.data)).toBeLessThan(300)
  return lot
}
