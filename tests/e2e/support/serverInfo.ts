/** Where the e2e server runs; shared by globalSetup (starts it) and the tests (use it). */
export const E2E_PORT = Number(process.env.E2E_PORT ?? 5199)
export const BASE_URL = `http://127.0.0.1:${E2E_PORT}`
// Env overrides let two people's e2e runs share the test cluster without dropping each other's database.
export const E2E_DB = process.env.E2E_DB ?? 'filmtrail_e2e'
export const SCREENSHOT_DIR = 'test-output/screenshots'

export function adminUrl(): string {
  return process.env.TEST_ADMIN_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/postgres'
}

export function e2eDatabaseUrl(): string {
  const url = new URL(adminUrl())
  url.pathname = `/${E2E_DB}`
  return url.toString()
}
