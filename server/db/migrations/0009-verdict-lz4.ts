import type { MigrationContext } from '../migrate'

/**
 * parts.verdict is rewritten after every write to a part (each readings POST): about 3 KB of
 * jsonb, which PostgreSQL compresses inline. With its default pglz that compression was half the
 * UPDATE's time; lz4 (built into Debian's PostgreSQL 15) does it several times faster. Measured
 * with pgbench on the benchmark's database, 12 parts per statement as a readings commit group
 * stores them: 1.55–1.72 ms with pglz, 0.87–0.96 ms with lz4. Only new values use lz4; stored
 * ones stay pglz until rewritten, and both read back the same.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('ALTER TABLE parts ALTER COLUMN verdict SET COMPRESSION lz4')
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('ALTER TABLE parts ALTER COLUMN verdict SET COMPRESSION pglz')
}
