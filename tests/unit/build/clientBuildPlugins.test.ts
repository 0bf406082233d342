import { readFileSync, readdirSync, statSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join } from 'node:path'
import postcss from 'postcss'
import { describe, expect, it } from 'vitest'
import * as mdi from '@mdi/js'
import { dropBreakpointUtilities } from '../../../scripts/responsiveUtilities'
import { mdiIconModules } from '../../../scripts/mdiIcons'

/**
 * The two build steps that keep the first page small ([P] project behaviour: the budget is
 * client_initial_kb_gzip of npm run bench). If one broke, a screen would lose its spacing or an
 * icon would go blank.
 */
const require = createRequire(import.meta.url)
const UTILITIES = require.resolve('vuetify/lib/styles/utilities.css')

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return sourceFiles(path)
    return /\.(vue|ts)$/.test(name) ? [path] : []
  })
}

describe('dropping the breakpoint variants of Vuetify utilities', () => {
  it('keeps the base and print utilities and drops every min-/max-width variant', async () => {
    const css = readFileSync(UTILITIES, 'utf8')
    const out = (await postcss([dropBreakpointUtilities()]).process(css, { from: UTILITIES })).css
    for (const kept of ['.ma-2', '.d-flex', '.text-center', '.d-sr-only', '.d-print-none'])
      expect(out).toContain(kept)
    for (const dropped of ['.ma-sm-2', '.d-md-flex', '.text-lg-center', '.hidden-sm-and-down'])
      expect(out).not.toContain(dropped)
    expect(out.length).toBeLessThan(css.length * 0.6)
  })

  it('leaves every other stylesheet alone', async () => {
    const css = '@media (min-width: 600px) { .ours { color: red } }'
    const out = (await postcss([dropBreakpointUtilities()]).process(css, { from: 'src/a.css' })).css
    expect(out).toBe(css)
  })

  it('no screen of ours uses a breakpoint utility class (they would do nothing)', () => {
    const breakpointClass =
      /\b(?:d|ma|mx|my|mt|mb|ms|me|pa|px|py|pt|pb|ps|pe|ga|text|flex|justify|align|align-self|align-content|order|float|overflow|position|gap)-(?:sm|md|lg|xl|xxl)-[a-z0-9-]+|\bhidden-(?:xs|sm|md|lg|xl|xxl)-and-(?:up|down)\b/
    const offenders = sourceFiles('src').filter((f) =>
      breakpointClass.test(readFileSync(f, 'utf8')),
    )
    expect(offenders).toEqual([])
  })
})

describe('one module per Material Design icon', () => {
  const plugin = mdiIconModules() as unknown as {
    transform(code: string, id: string): { code: string } | null
    resolveId(id: string): string | null
    load(this: { error(m: string): never }, id: string): string | null
  }
  const ctx = {
    error(m: string): never {
      throw new Error(m)
    },
  }

  it('rewrites an @mdi/js import into one import per icon, aliases kept', () => {
    const code = "import {\n  mdiCheck,\n  mdiClose as closeIcon,\n} from '@mdi/js'\nuse(mdiCheck)"
    const out = plugin.transform(code, '/app/src/X.vue')!.code
    expect(out).toContain("import mdiCheck from 'virtual:mdi-icon/mdiCheck';")
    expect(out).toContain("import closeIcon from 'virtual:mdi-icon/mdiClose';")
    expect(out).not.toContain('@mdi/js')
  })

  it('gives each icon exactly the path string @mdi/js exports', () => {
    for (const name of ['mdiCheck', 'mdiAlertOctagonOutline', 'mdiFilePdfBox'] as const) {
      const id = plugin.resolveId(`virtual:mdi-icon/${name}`)!
      expect(plugin.load.call(ctx, id)).toBe(`export default ${JSON.stringify(mdi[name])}`)
    }
  })

  it('refuses an icon @mdi/js does not have, rather than drawing nothing', () => {
    const id = plugin.resolveId('virtual:mdi-icon/mdiNoSuchIcon')!
    expect(() => plugin.load.call(ctx, id)).toThrow(/no icon named mdiNoSuchIcon/)
  })

  it('leaves packages in node_modules alone', () => {
    expect(plugin.transform("import { mdiCheck } from '@mdi/js'", '/x/node_modules/v/a.js')).toBe(
      null,
    )
  })
})
