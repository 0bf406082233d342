import type { MigrationContext } from '../migrate'

/**
 * mail_outbox.kind: 'certificate' (the certificate itself, PDF attached; sent only while it is
 * valid) or 'withdrawal' (a notice, no attachment, to each recipient the certificate had been
 * sent to when it was withdrawn, so a customer does not keep relying on it).
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE mail_outbox ADD COLUMN kind text NOT NULL DEFAULT 'certificate'
      CHECK (kind IN ('certificate', 'withdrawal'));
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('ALTER TABLE mail_outbox DROP COLUMN kind')
}
