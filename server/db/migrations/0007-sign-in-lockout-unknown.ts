import type { MigrationContext } from '../migrate'

/**
 * Failed sign-ins for addresses that belong to no account, counted and locked exactly as
 * users.failed_logins / users.locked_until are for real ones. Without it, the lockout answer
 * (423 after five failures) appeared only for addresses that exist, which told a stranger which
 * addresses have accounts. Rows of a day-old, expired streak are pruned on the next failure.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE sign_in_failures_unknown (
      email text PRIMARY KEY,
      failed_logins int NOT NULL DEFAULT 0 CHECK (failed_logins >= 0),
      locked_until timestamptz,
      last_failed_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sign_in_failures_unknown_last ON sign_in_failures_unknown (last_failed_at);
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE sign_in_failures_unknown')
}
