import type { Express } from 'express'
import pg from 'pg'
import { env } from './config/env'

/**
 * Benchmark only (npm run bench, scripts/bench): POST /api/_bench/bare inserts one row with pg
 * and answers its id — the yardstick `reading_post_overhead_ratio` divides by. Mounted only when
 * BENCH_BARE_ROUTE=1, behind the same helmet, logging and JSON parsing as the API but without
 * sign-in, validation or rules. It is not in the route table and not part of the API. The table
 * `bench_bare` is made by the benchmark in its own throwaway database.
 */
export function mountBenchBareRoute(app: Express) {
  const pool = new pg.Pool({ connectionString: env.DATABASE_URL, max: env.DB_POOL_MAX })
  app.post('/api/_bench/bare', async (req, res) => {
    const body = req.body as { clientId?: string; thicknessUm?: number }
    const { rows } = await pool.query<{ id: string }>(
      'INSERT INTO bench_bare (client_id, thickness_um) VALUES ($1, $2) RETURNING id',
      [body.clientId, body.thicknessUm],
    )
    res.status(201).json({ id: rows[0]!.id })
  })
}
