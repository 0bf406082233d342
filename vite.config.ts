import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import vuetify from 'vite-plugin-vuetify'
import { dropBreakpointUtilities } from './scripts/responsiveUtilities.ts'
import { mdiIconModules } from './scripts/mdiIcons.ts'

const apiPort = process.env.PORT ?? '5180'

// One config for the client build, the dev server and vitest.
export default defineConfig({
  plugins: [mdiIconModules(), vue(), vuetify({ autoImport: true })],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  css: { postcss: { plugins: [dropBreakpointUtilities()] } },
  // Every component (ours, Vuetify's, the router's) is written with setup(): Vue's Options API
  // support is dead weight in the first page's JavaScript.
  define: { __VUE_OPTIONS_API__: 'false' },
  optimizeDeps: { exclude: ['vuetify'] },
  server: {
    host: '127.0.0.1',
    port: 5173,
    strictPort: true,
    proxy: { '/api': `http://127.0.0.1:${apiPort}` },
  },
  preview: { host: '127.0.0.1' },
  build: {
    outDir: 'dist',
    chunkSizeWarningLimit: 800,
    // Fonts are never inlined into the CSS: as files, the browser fetches only the subsets whose
    // unicode-range the page uses (usually latin); inlined, every page carried all of them
    // (17 KB gzip of base64 in the main stylesheet).
    assetsInlineLimit: (file) => (/\.(woff2?|ttf|otf)$/.test(file) ? false : undefined),
  },
  test: {
    server: { deps: { inline: ['vuetify'] } },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          include: ['tests/client/**/*.test.ts'],
          environment: 'happy-dom',
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/api/support/globalSetup.ts'],
          setupFiles: ['tests/api/support/perFileDatabase.ts'],
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.e2e.test.ts'],
          environment: 'node',
          globalSetup: ['tests/e2e/support/globalSetup.ts'],
          fileParallelism: false,
          testTimeout: 60000,
          hookTimeout: 120000,
        },
      },
    ],
  },
})
