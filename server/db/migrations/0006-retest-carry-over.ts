import type { MigrationContext } from '../migrate'

/**
 * A repair-and-retest round keeps the records that a touch-up cannot change (the blast, the
 * climate at coating, the gauge set-up, cure and adhesion of the original film): they are carried
 * from the earlier round unless re-recorded. A strip-and-recoat round starts from nothing.
 * `carried_sections` lists what the part's current round may carry; empty for round 1.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE parts ADD COLUMN carried_sections text[] NOT NULL DEFAULT '{}';
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('ALTER TABLE parts DROP COLUMN carried_sections')
}
