/**
 * What the measurements need in the bench database, after the history is written:
 * every account gets one bench password (so the server can start with NODE_ENV=production, which
 * refuses the published demo password), open lots with many parts for the readings load, a DFT
 * gauge in calibration, and the table of the bare yardstick route.
 */
import { randomBytes, randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import pg from 'pg'
import { addDays, localIsoDate } from '../../shared/api/calibration'

/** The server's database pool in every bench measurement (the trends replay uses as many). */
export const BENCH_POOL_MAX = 10

/**
 * The bench server's settings, the same for npm run bench and scripts/bench/focus.ts:
 * production mode, quiet log, the bare yardstick route mounted, sign-in not rate-limited.
 */
export function benchServerEnv(jwtSecret: string, extra: Record<string, string> = {}) {
  return {
    NODE_ENV: 'production',
    LOG_LEVEL: 'warn',
    JWT_SECRET: jwtSecret,
    DB_POOL_MAX: String(BENCH_POOL_MAX),
    LOGIN_RATE_LIMIT: '1000',
    BENCH_BARE_ROUTE: '1',
    ...extra,
  }
}

export const BENCH_PASSWORD = `bench-${randomBytes(12).toString('hex')}`

export async function prepareDatabase(url: string) {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    await db.query('UPDATE users SET password_hash = $1, failed_logins = 0, locked_until = NULL', [
      bcrypt.hashSync(BENCH_PASSWORD, 10),
    ])
    await db.query(`CREATE TABLE IF NOT EXISTS bench_bare (
      id bigserial PRIMARY KEY, client_id uuid NOT NULL UNIQUE, thickness_um float8,
      at timestamptz NOT NULL DEFAULT now())`)
  } finally {
    await db.end()
  }
}

export async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: BENCH_PASSWORD }),
  })
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`)
  return `Bearer ${((await res.json()) as { token: string }).token}`
}

export interface ReadingTargets {
  partIds: number[]
  instrumentId: number
}

/**
 * Opens `lots` FBE lots of `partsPerLot` parts through the real API (as the operator), on a spec
 * judged by SSPC-PA 2, and picks the DFT gauge whose calibration runs longest.
 */
export async function openLotsForReadings(
  base: string,
  url: string,
  auth: string,
  lots: number,
  partsPerLot: number,
): Promise<ReadingTargets> {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  let specId: number, customerId: number, instrumentId: number
  try {
    const spec = await db.query<{ id: number }>(`
      SELECT c.id FROM coating_specs c JOIN spec_versions v ON v.spec_id = c.id AND v.version = c.current_version
       WHERE v.content->'thickness'->>'rule' = 'SSPC-PA2' ORDER BY c.id LIMIT 1`)
    const customer = await db.query<{ id: number }>(
      'SELECT id FROM customers WHERE active ORDER BY id LIMIT 1',
    )
    const gauge = await db.query<{ id: number }>(
      `
      SELECT id FROM instruments WHERE active AND kind LIKE 'dft-gauge-%' AND calibration_due_on > $1::date
       ORDER BY calibration_due_on DESC LIMIT 1`,
      [addDays(localIsoDate(), 7)],
    )
    if (!spec.rows[0] || !customer.rows[0] || !gauge.rows[0])
      throw new Error('the demo seed has no SSPC-PA 2 spec, customer or DFT gauge in calibration')
    specId = spec.rows[0].id
    customerId = customer.rows[0].id
    instrumentId = gauge.rows[0].id
  } finally {
    await db.end()
  }
  const partIds: number[] = []
  for (let l = 0; l < lots; l++) {
    const res = await fetch(`${base}/api/lots`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Authorization: auth },
      body: JSON.stringify({
        clientId: randomUUID(),
        customerId,
        orderRef: `PO-BENCH-${l + 1}`,
        specId,
        line: 'fbe-powder',
        shift: '1',
        coatingMaterial: 'FBE powder, green (bench)',
        batchNumber: `PB-B${l + 1}`,
        batchExpiresOn: addDays(localIsoDate(), 60),
        parts: Array.from({ length: partsPerLot }, (_, p) => ({
          clientId: randomUUID(),
          partNumber: `VB-${100 + (p % 50)}-PN16`,
          description: 'Gate valve body',
          heatNumber: `HB${l}-${p}`,
          coatedAreaM2: 0.8,
        })),
      }),
    })
    if (!res.ok) throw new Error(`opening a bench lot failed: ${res.status} ${await res.text()}`)
    const lot = (await res.json()) as { parts: { id: number }[] }
    partIds.push(...lot.parts.map((p) => p.id))
  }
  return { partIds, instrumentId }
}
