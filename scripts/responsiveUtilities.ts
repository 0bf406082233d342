import type { Plugin } from 'postcss'

/**
 * A PostCSS step of the client build: drops the breakpoint variants of Vuetify's utility classes
 * (`ma-sm-2`, `d-md-flex`, `text-lg-center`, `hidden-sm-and-down` … every `@media (min-width|
 * max-width …)` block of vuetify/lib/styles/utilities.css). Filmtrail's screens lay out with
 * Vuetify's grid and components, never with a breakpoint utility class (the unit test
 * tests/unit/build/clientBuildPlugins.test.ts keeps it so), and those blocks were over half of
 * the main stylesheet: 16 KB gzip on every first page. The base utilities and the print ones stay.
 */
export function dropBreakpointUtilities(): Plugin {
  return {
    postcssPlugin: 'filmtrail-drop-breakpoint-utilities',
    Once(root) {
      const file = root.source?.input.file?.replace(/\\/g, '/') ?? ''
      if (!file.endsWith('vuetify/lib/styles/utilities.css')) return
      root.walkAtRules('media', (rule) => {
        if (/\b(min|max)-width\b/.test(rule.params)) rule.remove()
      })
    },
  }
}
