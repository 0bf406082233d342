import { z } from 'zod'

/**
 * A calendar day as YYYY-MM-DD that exists: 2026-02-30 has the right shape but is no day, and
 * PostgreSQL refuses it — it must be a 400 naming the field, not a failed query.
 */
export const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD')
  .refine((d) => {
    const parsed = new Date(`${d}T00:00:00Z`)
    return !Number.isNaN(parsed.getTime()) && parsed.toISOString().startsWith(d)
  }, 'No such calendar date')
