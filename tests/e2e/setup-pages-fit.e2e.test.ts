import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { VIEWPORTS, openBrowser, screenshot, signIn, type BrowserSession } from './support/browser'
import { BASE_URL } from './support/serverInfo'

/**
 * The Setup pages on the shop's screens: a 10-inch tablet held upright (800 × 1280) and a desk
 * PC (1440 × 900). A page that scrolls sideways, or a button smaller than a gloved fingertip
 * (48 px, [P] common touch-target guidance), is something an admin at the line would notice.
 */
const PAGES = [
  { path: '/', ready: 'Calibration to watch', name: 'home' },
  { path: '/setup/specs', ready: 'Coating specs', name: 'specs' },
  { path: '/setup/specs/new', ready: 'New coating spec', name: 'spec-new' },
  { path: '/setup/instruments', ready: 'Instruments', name: 'instruments' },
  { path: '/setup/customers', ready: 'Customers', name: 'customers' },
  { path: '/setup/people', ready: 'People', name: 'people' },
  { path: '/setup/settings', ready: 'Plant settings', name: 'settings' },
]

for (const [label, viewport] of [
  ['800x1280', VIEWPORTS.tabletPortrait],
  ['1440x900', VIEWPORTS.desktop],
] as const) {
  describe(`Setup pages at ${label}`, () => {
    let b: BrowserSession
    beforeAll(async () => {
      b = await openBrowser(viewport)
      await signIn(b.page, 'admin@harrowgate.example')
    })
    afterAll(async () => {
      await b?.close()
    })

    for (const p of PAGES) {
      it(`${p.name}: no sideways scroll, touch targets of 48 px`, async () => {
        const { page } = b
        await page.goto(`${BASE_URL}${p.path}`)
        await page.getByText(p.ready, { exact: true }).first().waitFor()
        await page.waitForLoadState('networkidle')
        await screenshot(page, `${p.name}-${label}`, false)
        const overflow = await page.evaluate(
          () => document.documentElement.scrollWidth - window.innerWidth,
        )
        expect(overflow, 'page wider than the screen').toBeLessThanOrEqual(0)
        // A table that scrolls sideways hides its last column (the actions) from a tablet user.
        const wideTables = await page.evaluate(
          () =>
            [...document.querySelectorAll('.v-table__wrapper')].filter(
              (w) => w.scrollWidth > w.clientWidth + 1,
            ).length,
        )
        expect(wideTables, 'tables wider than their card').toBe(0)
        const small = await page.evaluate(() =>
          [
            ...document.querySelectorAll<HTMLElement>(
              'main .v-btn, nav .v-list-item, header .v-btn',
            ),
          ]
            .map((el) => ({ el, r: el.getBoundingClientRect() }))
            .filter(({ r }) => r.width > 0 && r.height > 0 && (r.height < 47.5 || r.width < 47.5))
            .map(
              ({ el, r }) =>
                `${el.textContent?.trim() || el.getAttribute('aria-label')} ${Math.round(r.width)}×${Math.round(r.height)}`,
            ),
        )
        expect(small, 'touch targets under 48 px').toEqual([])
        expect(b.problems).toEqual([])
      })
    }
  })
}
