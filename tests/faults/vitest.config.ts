import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'

/**
 * `npm run test:faults`: the fault tests (tests/faults/*.fault.test.ts) — real server processes
 * killed, an SMTP server down — each on a throwaway PostgreSQL cluster of its own. About two
 * minutes on a quiet machine, so not part of the default `npm test` run (see tests/faults/README.md).
 */
export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    name: 'faults',
    include: ['tests/faults/**/*.fault.test.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 300_000,
    hookTimeout: 300_000,
  },
})
