/** API steps of the review browser test: what the line records between the supervisor's screens. */
import { expect } from 'vitest'
import type { PartDetail, SectionName, SectionRecordRow } from '../../../shared/api/lots'
import { BASE_URL, DEMO_PASSWORD } from '../support/browser'

export async function apiToken(email: string): Promise<string> {
  const res = await fetch(`${BASE_URL}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  expect(res.status, `sign-in of ${email}`).toBe(200)
  return ((await res.json()) as { token: string }).token
}

export async function api<T>(
  token: string,
  method: string,
  path: string,
  body?: unknown,
): Promise<{ status: number; data: T }> {
  const res = await fetch(`${BASE_URL}${path}`, {
    method,
    headers: {
      Authorization: `Bearer ${token}`,
      ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
  const text = await res.text()
  return { status: res.status, data: (text ? JSON.parse(text) : null) as T }
}

/**
 * The operator's retest of a repaired part, through the API with the operator's own token: the
 * floor screens record one section at a time by touch, which is the line-tablet test's subject.
 * A repair round carries the round-1 records the repair does not touch (the part's
 * carriedSections); whatever is not carried is recorded again with round 1's data and
 * instruments. Then 5 spots × 3 readings inside the band, and the holiday test at the voltage
 * the verdict now asks for (NACE SP0490 follows the measured mean, so it is read back).
 */
export async function recordRetestByApi(
  token: string,
  partId: number,
  spotsUm: number[][],
): Promise<PartDetail> {
  const before = (await api<PartDetail>(token, 'GET', `/api/parts/${partId}`)).data
  expect(before.round, 'the repair opened round 2').toBe(2)
  const round1 = new Map<SectionName, SectionRecordRow>()
  for (const r of [...before.history, ...Object.values(before.sections)]) {
    if (r && r.round === 1) round1.set(r.section, r)
  }
  const put = async (section: SectionName, data: unknown, instrumentId: number | null) => {
    const r = await api<PartDetail>(token, 'PUT', `/api/parts/${partId}/sections/${section}`, {
      clientId: crypto.randomUUID(),
      instrumentId,
      data,
    })
    expect(r.status, `${section} of round 2`).toBeLessThan(300)
    return r.data
  }
  for (const s of ['surface-prep', 'climate', 'thickness-gauge', 'cure', 'adhesion'] as const) {
    const r = round1.get(s)
    if (r && !before.carriedSections.includes(s)) await put(s, r.data, r.instrumentId)
  }
  const gauge = round1.get('thickness-gauge')!.instrumentId!
  const readings = spotsUm.flatMap((spot, i) =>
    spot.map((thicknessUm) => ({
      clientId: crypto.randomUUID(),
      areaNo: 1,
      spotNo: i + 1,
      thicknessUm,
      instrumentId: gauge,
    })),
  )
  const stored = await api(token, 'POST', `/api/parts/${partId}/readings`, { readings })
  expect(stored.status).toBe(201)
  const mid = (await api<PartDetail>(token, 'GET', `/api/parts/${partId}`)).data
  const holiday = mid.verdict!.criteria.find((c) => c.criterion === 'holiday')!
  const requiredV = Number(holiday.numbers.requiredVoltageV)
  const h = round1.get('holiday')!
  return put(
    'holiday',
    { ...(h.data as object), voltageUsedV: Math.ceil(requiredV), holidays: [] },
    h.instrumentId,
  )
}
