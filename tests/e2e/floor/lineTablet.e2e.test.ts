import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { VIEWPORTS, screenshot } from '../support/browser'
import { BASE_URL } from '../support/serverInfo'
import type { LotDetail } from '../../../shared/api/lots'
import {
  apiGet,
  apiToken,
  getPart,
  openTablet,
  sidewaysOverflow,
  signInByTouch,
  smallTargets,
  type Tablet,
} from './tablet'
import {
  badge,
  keyReading,
  padReading,
  progressText,
  slotText,
  tapOption,
  useGauge,
} from './lineTabletSteps'

/**
 * The line tablet, end to end against the real server: an operator opens a lot (the server
 * refuses an expired batch and the form keeps what was typed), records a part by touch only, the
 * Wi-Fi drops, readings keep going in and show as waiting (and count toward the live plan), the
 * Wi-Fi returns and every reading is stored — checked through the API, not the screen.
 * Spec HFW-FBE-01 (seed): SSPC-PA 2, 12–20 mil = 304.8–508 µm. A 0.5 m² (5.4 ft²) part is one
 * area of 5 spots × ≥ 3 readings (SSPC-PA 2 area rule, small part under 100 ft² [R]).
 */
const OPERATOR = 'operator@harrowgate.example'
const GAUGE = 'HFW-DFT2-0417'
// In the band, so the thickness criterion must not fail: spot means 380–420 µm.
const SPOTS = [
  ['380', '385', '390'],
  ['400', '402', '398'],
  ['410', '415', '405'],
  ['395', '390', '392'],
  ['420', '418', '416'],
]

async function openLotByApi(token: string): Promise<LotDetail> {
  const specs = await apiGet<{ id: number; code: string }[]>(token, '/api/specs')
  const res = await fetch(`${BASE_URL}/api/lots`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      clientId: crypto.randomUUID(),
      customerId: 3,
      orderRef: 'PO-E2E-PORTRAIT',
      specId: specs.find((s) => s.code === 'HFW-FBE-01')!.id,
      line: 'fbe-powder',
      shift: '2',
      coatingMaterial: 'Harrowmark FBE 7-200, green (fictional)',
      batchNumber: 'PB-E2E-2',
      batchExpiresOn: '2031-01-31',
      parts: [
        {
          clientId: crypto.randomUUID(),
          partNumber: 'VB-E2E-200',
          heatNumber: 'HT-E2E-2',
          coatedAreaM2: 0.5,
        },
      ],
    }),
  })
  expect(res.status).toBe(201)
  return (await res.json()) as LotDetail
}

async function checkLayout(t: Tablet, name: string) {
  await screenshot(t.page, name, false)
  expect(await sidewaysOverflow(t.page), `${name}: page wider than the screen`).toBeLessThanOrEqual(
    0,
  )
  expect(await smallTargets(t.page), `${name}: touch targets under 48 px`).toEqual([])
}

describe('line tablet at 1280×800 (landscape)', () => {
  let t: Tablet
  let token: string
  beforeAll(async () => {
    t = await openTablet(VIEWPORTS.tabletLandscape)
    token = await apiToken(OPERATOR)
    await signInByTouch(t.page, OPERATOR)
  })
  afterAll(async () => t?.close())

  it('opens a lot: an expired batch is refused with the server’s message and nothing typed is lost', async () => {
    const { page } = t
    await page.goto(`${BASE_URL}/line/lots`)
    await page.locator('[data-test="open-lot"]').tap()
    await tapOption(page, 'lot-customer', 'Brackenholt Water Company')
    await tapOption(page, 'lot-spec', /^HFW-FBE-01/)
    await page.locator('[data-test="lot-spec-version"]').getByText('version 1').waitFor()
    await page.locator('[data-test="lot-order"] input').fill('PO-E2E-LANDSCAPE')
    await page
      .locator('[data-test="lot-material"] input')
      .fill('Harrowmark FBE 7-200, green (fictional)')
    await page.locator('[data-test="lot-batch"] input').fill('PB-E2E-1')
    await page.locator('[data-test="lot-batch-expiry"] input').fill('2020-01-31')
    await page.locator('[data-test="part-number"] input').fill('VB-E2E-100')
    await page.locator('[data-test="heat-number"] input').fill('HT-E2E-1')
    await page.locator('[data-test="coated-area"] input').fill('0.5')
    await page.locator('[data-test="lot-save"]').tap()
    await page.locator('[data-test="lot-refused"]').waitFor()
    expect(await page.locator('[data-test="lot-refused"]').textContent()).toMatch(
      /expired|use-by|past/i,
    )
    expect(await page.locator('[data-test="lot-order"] input').inputValue()).toBe(
      'PO-E2E-LANDSCAPE',
    )
    expect(await page.locator('[data-test="part-number"] input').inputValue()).toBe('VB-E2E-100')
    await checkLayout(t, 'floor-lot-refused-1280x800')

    await page.locator('[data-test="lot-batch-expiry"] input').fill('2031-01-31')
    await page.locator('[data-test="lot-save"]').tap()
    await page.waitForURL(/\/line\/lots\/\d+$/)
    await page.locator('[data-part="VB-E2E-100"]').waitFor()
    await checkLayout(t, 'floor-lot-1280x800')
  })

  it('records readings by touch, keeps them through a network drop, and stores them all', async () => {
    const { page, context } = t
    await page.locator('[data-part="VB-E2E-100"]').tap()
    await page.waitForURL(/\/line\/parts\/\d+/)
    const partId = Number(/parts\/(\d+)/.exec(page.url())![1])
    await useGauge(page, GAUGE)
    expect(await slotText(page)).toBe('Area 1 · spot 1 · reading 1')

    for (const r of SPOTS[0]!) await padReading(page, r)
    for (const spot of SPOTS.slice(1, 3)) for (const r of spot) await keyReading(page, r)
    await expect.poll(async () => (await badge(page)).text, { timeout: 15_000 }).toBe('All sent')
    await expect.poll(() => progressText(page)).toBe('3 of 5 spots')

    await context.setOffline(true)
    for (const spot of SPOTS.slice(3)) for (const r of spot) await keyReading(page, r)
    // Offline readings are on the grid as waiting and count toward the live plan.
    await expect
      .poll(() => page.locator('[data-test="pa2-grid"] [data-state="waiting"]').count())
      .toBe(6)
    await expect.poll(async () => (await badge(page)).waiting, { timeout: 15_000 }).toBe(6)
    expect((await badge(page)).text).toContain('6 waiting')
    expect(await progressText(page)).toBe('5 of 5 spots')
    expect(
      await page.locator('[data-test="verdict-panel"]:visible').first().getAttribute('data-source'),
    ).toBe('live')
    expect((await getPart(token, partId)).readings).toHaveLength(9)
    await checkLayout(t, 'floor-part-offline-1280x800')

    await context.setOffline(false)
    await expect.poll(async () => (await badge(page)).text, { timeout: 30_000 }).toBe('All sent')
    const stored = await getPart(token, partId)
    expect(stored.readings.filter((r) => !r.discarded).map((r) => r.thicknessUm)).toEqual(
      SPOTS.flat().map(Number),
    )
    expect(stored.verdict?.samplingPlan.spotsRecorded).toBe(5)
    expect(stored.verdict?.criteria.find((c) => c.criterion === 'thickness')?.status).toBe('pass')
    await expect
      .poll(
        () =>
          page.locator('[data-test="verdict-panel"]:visible').first().getAttribute('data-source'),
        { timeout: 10_000 },
      )
      .toBe('server')
    await checkLayout(t, 'floor-part-thickness-1280x800')
  })

  it('climate shows the dew point and margin while typing (TRADE.md §5: 20 °C / 60 % → 12.00 °C [C])', async () => {
    const { page } = t
    await page.locator('[data-tab="climate"]').tap()
    await page.locator('[data-test="air-temp"] input').fill('20')
    await page.locator('[data-test="rh"] input').fill('60')
    await page.locator('[data-test="steel-temp"] input').fill('15')
    expect(await page.locator('[data-test="dew-point"]').textContent()).toBe('12.0 °C')
    expect(await page.locator('[data-test="climate-verdict"]').textContent()).toContain(
      'Fit to coat',
    )
    // Gate [C]: at 20 °C / 60 % the steel must be ≥ 15.0 °C; 14.9 fails.
    await page.locator('[data-test="steel-temp"] input').fill('14.9')
    expect(await page.locator('[data-test="climate-verdict"]').textContent()).toContain(
      'Do not coat',
    )
    await page.locator('[data-test="steel-temp"] input').fill('15')
    await page.locator('[data-test="section-climate"] [data-test="section-save"]').tap()
    await page.locator('[data-test="section-notice"]').waitFor()
    await checkLayout(t, 'floor-part-climate-1280x800')
    expect(t.problems).toEqual([])
  })
})

describe('line tablet at 800×1280 (portrait)', () => {
  let t: Tablet
  let token: string
  let lot: LotDetail
  beforeAll(async () => {
    t = await openTablet(VIEWPORTS.tabletPortrait)
    token = await apiToken(OPERATOR)
    lot = await openLotByApi(token)
    await signInByTouch(t.page, OPERATOR)
  })
  afterAll(async () => t?.close())

  it('records a spot online and one offline, shows the waiting count, then stores both', async () => {
    const { page, context } = t
    await page.goto(`${BASE_URL}/line/lots/${lot.id}`)
    await page.locator('[data-part="VB-E2E-200"]').tap()
    await page.waitForURL(/\/line\/parts\/\d+/)
    const partId = lot.parts[0]!.id
    await useGauge(page, GAUGE)
    for (const r of SPOTS[0]!) await padReading(page, r)
    await expect.poll(async () => (await badge(page)).text, { timeout: 15_000 }).toBe('All sent')

    await context.setOffline(true)
    for (const r of SPOTS[1]!) await padReading(page, r)
    await expect.poll(async () => (await badge(page)).waiting, { timeout: 15_000 }).toBe(3)
    expect(await progressText(page)).toBe('2 of 5 spots')
    expect(await slotText(page)).toBe('Area 1 · spot 3 · reading 1')
    await checkLayout(t, 'floor-part-offline-800x1280')
    await page.locator('[data-test="queue-badge"]').tap()
    await page.locator('[data-test="queue-waiting"]').first().waitFor()
    expect(await page.locator('[data-test="queue-waiting"]').count()).toBe(3)
    await checkLayout(t, 'floor-queue-offline-800x1280')

    await context.setOffline(false)
    await expect.poll(async () => (await badge(page)).text, { timeout: 30_000 }).toBe('All sent')
    expect(await page.locator('[data-test="queue-waiting"]').count()).toBe(0)
    const stored = await getPart(token, partId)
    expect(stored.readings.map((r) => r.thicknessUm)).toEqual(SPOTS.slice(0, 2).flat().map(Number))
    expect(stored.readings.every((r) => r.areaNo === 1 && r.spotNo >= 1 && r.spotNo <= 2)).toBe(
      true,
    )
    await page.goBack()
    await page.locator('[data-test="pa2-grid"]').waitFor()
    await checkLayout(t, 'floor-part-thickness-800x1280')
    expect(t.problems).toEqual([])
  })

  it('imports a gauge file: offline before it was first opened it says why; online it previews, continues after the recorded spots and saves', async () => {
    const { page, context } = t
    const partId = lot.parts[0]!.id
    await context.setOffline(true)
    await page.locator('[data-test="import-open"]').tap()
    await page.locator('[data-test="import-unavailable"]').waitFor()
    expect(await page.locator('[data-test="gauge-import"]').count()).toBe(0)

    await context.setOffline(false)
    await page.locator('[data-test="import-open"]').tap()
    await page.locator('[data-test="gauge-import"]').waitFor()
    expect(await page.locator('[data-test="import-unavailable"]').count()).toBe(0)
    // A one-column export (the shared parser: spots of 3 readings, SSPC-PA 2 [R]) of one spot.
    await page.locator('[data-test="gauge-file"]').setInputFiles({
      name: 'gauge-export.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from('Reading\n400\n405\n410\n'),
    })
    await expect
      .poll(() => page.locator('[data-test="import-summary"]').textContent())
      .toContain('3 readings read')
    await screenshot(page, 'floor-gauge-import-800x1280', false)
    await page.locator('[data-test="import-confirm"]').tap()
    await page.locator('[data-test="import-outcome"]').waitFor()
    await expect.poll(async () => (await badge(page)).text, { timeout: 15_000 }).toBe('All sent')
    const stored = await getPart(token, partId)
    // Spots 1 and 2 were recorded by hand above: the file's spot continues as spot 3.
    expect(stored.readings.filter((r) => r.spotNo === 3).map((r) => r.thicknessUm)).toEqual([
      400, 405, 410,
    ])
    expect(t.problems).toEqual([])
  })
})
