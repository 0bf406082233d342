import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from './index'
import { takePendingBegin } from './pipelinedTransaction'

/** Sequelize's own Query class of the postgres dialect: only its error mapping is used. */
const SequelizeQuery = (
  (sequelize as unknown as { dialect: unknown }).dialect as {
    Query: new (
      c: unknown,
      s: unknown,
      o: object,
    ) => { formatError(e: unknown, stack?: string): Error }
  }
).Query

interface PgClient {
  query(config: { name: string; text: string; values: unknown[] }): Promise<{ rows: unknown[] }>
  _invalid?: boolean
}

/**
 * A statement of the write hot path (every readings batch, every verdict, every audit event) as a
 * named prepared statement on the transaction's own connection: PostgreSQL parses and plans it
 * once per connection instead of on every call (planning was the larger part of these
 * statements' database time), and Sequelize's per-query work is skipped. Same connection, same
 * transaction, same type parsers as sequelize.query; a driver error becomes the same Sequelize
 * error sequelize.query would throw (ConnectionError → 503, UniqueConstraintError → 409 …), and a
 * connection reset marks the connection invalid for the pool, as Sequelize does. `name` must be
 * unique per SQL text.
 */
export async function preparedQuery<T>(
  t: Transaction,
  name: string,
  text: string,
  values: unknown[],
): Promise<T[]> {
  const client = (t as unknown as { connection?: PgClient }).connection
  if (!client || typeof client.query !== 'function')
    return sequelize.query<T & object>(text, {
      bind: values,
      type: QueryTypes.SELECT,
      transaction: t,
    })
  // No stack is captured ahead for the error: made in the catch below, it already carries the
  // awaiting callers (V8's async stack traces), and capturing one per call cost a twentieth of a
  // readings POST's CPU.
  try {
    const query = client.query({ name, text, values })
    // The first statement of a pipelined transaction also answers for its BEGIN.
    const begin = takePendingBegin(t)
    const result = begin ? (await Promise.all([begin, query]))[1] : await query
    return result.rows as T[]
  } catch (err) {
    if ((err as { code?: string }).code === 'ECONNRESET') client._invalid = true
    throw new SequelizeQuery(client, sequelize, {}).formatError(err)
  }
}
