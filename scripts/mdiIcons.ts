import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { Plugin } from 'vite'

const PREFIX = 'virtual:mdi-icon/'
const RESOLVED = '\0mdi-icon:'
const IMPORT = /import\s*\{([^}]*)\}\s*from\s*['"]@mdi\/js['"];?/g

/**
 * A Vite plugin of the client build: each Material Design icon imported from @mdi/js becomes a
 * module of its own. @mdi/js is one module with every icon as an export; the bundler keeps only
 * the icons used, but as one module it lands whole in the chunk shared by all pages, so the
 * sign-in page downloaded every icon of every screen (21 KB of SVG paths). One module per icon,
 * each page's chunks carry the icons they show. Same strings, same import lines in the sources.
 */
export function mdiIconModules(): Plugin {
  let paths: Map<string, string> | null = null
  const pathOf = (name: string) => {
    if (!paths) {
      const pkg = createRequire(import.meta.url).resolve('@mdi/js/package.json')
      const source = readFileSync(pkg.replace(/package\.json$/, 'mdi.js'), 'utf8') // the ES module
      paths = new Map([...source.matchAll(/var (mdi\w+) = "([^"]*)"/g)].map((m) => [m[1]!, m[2]!]))
    }
    return paths.get(name)
  }
  return {
    name: 'filmtrail-mdi-icon-modules',
    enforce: 'pre',
    transform(code, id) {
      // the client's sources only (src/): not packages, not tests, not the server
      if (!/\/src\//.test(id) || id.includes('node_modules') || !code.includes('@mdi/js'))
        return null
      const out = code.replace(IMPORT, (_all, names: string) =>
        names
          .split(',')
          .map((n) => n.trim())
          .filter(Boolean)
          .map((n) => {
            const [icon, local = icon] = n.split(/\s+as\s+/)
            return `import ${local} from '${PREFIX}${icon}';`
          })
          .join('\n'),
      )
      return out === code ? null : { code: out, map: null }
    },
    resolveId(id) {
      return id.startsWith(PREFIX) ? RESOLVED + id.slice(PREFIX.length) : null
    },
    load(id) {
      if (!id.startsWith(RESOLVED)) return null
      const name = id.slice(RESOLVED.length)
      const path = pathOf(name)
      if (path === undefined) this.error(`@mdi/js has no icon named ${name}`)
      return `export default ${JSON.stringify(path)}`
    },
  }
}
