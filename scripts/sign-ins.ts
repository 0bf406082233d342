/**
 * Prints the demo sign-ins for the start banner (scripts/stack.sh), from the seed's own list, so
 * the banner never disagrees with what the seed created.
 */
import { DEMO_SIGN_INS } from '../server/db/seeders/users.seed'
import { DEMO_PASSWORD } from '../server/db/seeders/demoPassword'

console.log(`Demo sign-ins, all with the password ${DEMO_PASSWORD}`)
for (const s of DEMO_SIGN_INS)
  console.log(`  ${s.email.padEnd(32)} ${s.role.padEnd(11)} ${s.purpose}`)
process.exit(0)
