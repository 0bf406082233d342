import { execFileSync } from 'node:child_process'
import pg from 'pg'

/**
 * Once per test run: (re)creates the migrated template database that every API test file
 * copies (perFileDatabase.ts). The PostgreSQL server itself is started by scripts/test.sh.
 */
export const TEMPLATE_DB = 'filmtrail_template'

export function adminUrl() {
  return process.env.TEST_ADMIN_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/postgres'
}

export default async function setup() {
  const client = new pg.Client({ connectionString: adminUrl() })
  try {
    await client.connect()
  } catch (err) {
    throw new Error(
      `API tests need the throwaway PostgreSQL: run them through "npm test" (or start it with ` +
        `"scripts/db.sh start test"). ${(err as Error).message}`,
    )
  }
  await client.query(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`)
  await client.query(`CREATE DATABASE ${TEMPLATE_DB}`)
  await client.end()
  const url = new URL(adminUrl())
  url.pathname = `/${TEMPLATE_DB}`
  execFileSync('npx', ['tsx', 'server/cli/migrate.ts'], {
    env: { ...process.env, DATABASE_URL: url.toString(), JWT_SECRET: 'x'.repeat(40), NODE_ENV: 'test' },
    stdio: 'inherit',
  })
}
