/** `npm run db:migrate`: applies every pending migration. */
import { sequelize } from '../db'
import { migrateUp } from '../db/migrate'

const applied = await migrateUp(sequelize)
console.log(applied.length ? `Applied ${applied.map((m) => m.name).join(', ')}` : 'Database schema is up to date')
await sequelize.close()
