/**
 * `npx tsx server/cli/seed.ts`: applies pending migrations, then the demo seed for the invented
 * plant Harrowgate Flow Works. Safe to run again: it adds only what is missing.
 */
import { env } from '../config/env'
import { sequelize } from '../db'
import { migrateUp } from '../db/migrate'
import { DEMO_PASSWORD, DEMO_SIGN_INS, runSeed } from '../db/seeders'

if (env.NODE_ENV === 'production' && !process.argv.includes('--allow-production')) {
  console.error(
    'Refusing to seed demo data into a production database (pass --allow-production to insist).',
  )
  process.exit(1)
}

try {
  await migrateUp(sequelize)
  const summary = await runSeed()
  console.log(`Demo seed for Harrowgate Flow Works (dates counted from ${summary.today}):`)
  for (const [what, n] of Object.entries(summary.tally)) {
    console.log(`  ${what.padEnd(20)} ${n.created} added, ${n.kept} already there`)
  }
  if (summary.skipped.length) console.log(`  already seeded once: ${summary.skipped.join(', ')}`)
  console.log(`\nDemo sign-ins (password for all: ${DEMO_PASSWORD}):`)
  for (const s of DEMO_SIGN_INS)
    console.log(`  ${s.email.padEnd(32)} ${s.role.padEnd(11)} ${s.purpose}`)
} finally {
  await sequelize.close()
}
