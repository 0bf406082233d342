import { dirname } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Umzug, SequelizeStorage } from 'umzug'
import type { QueryInterface, Sequelize } from 'sequelize'

const here = dirname(fileURLToPath(import.meta.url))

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize }

export function migrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: { glob: ['migrations/*.ts', { cwd: here }] },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}

export async function migrateUp(sequelize: Sequelize) {
  return migrator(sequelize).up()
}
