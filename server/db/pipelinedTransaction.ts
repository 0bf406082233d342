import { Transaction } from 'sequelize'
import { sequelize } from './index'

/**
 * A transaction for the write hot path whose BEGIN leaves with its first statement and whose
 * COMMIT leaves with its last ones (pg pipeline mode, server/db/index.ts): a readings POST is then
 * three network round trips (BEGIN + the lock; INSERT + the verdict's rows; verdict UPDATE +
 * audit event + COMMIT) instead of seven, one per statement. It is a real Sequelize Transaction (same connection
 * pool, `transaction: t` works in every query, afterCommit hooks run); only BEGIN and COMMIT are
 * sent differently.
 *
 * Safety of sending ahead:
 * - BEGIN: the first statement through preparedQuery awaits BEGIN's answer together with its own,
 *   and the hot path writes nothing before that first statement (the row lock) has answered; a
 *   BEGIN that failed is therefore seen before any write is sent.
 * - COMMIT: sent right behind the last statements. If one of them fails, PostgreSQL ends the
 *   failed transaction with a ROLLBACK when the COMMIT arrives; the error of the statement is
 *   what the caller gets, and nothing was stored.
 */
interface PgClient {
  query(text: string): Promise<unknown>
  uuid?: string
  _invalid?: boolean
}
interface ConnectionManager {
  getConnection(options: { uuid: string }): Promise<PgClient>
  releaseConnection(connection: PgClient): Promise<void>
}
type HotTransaction = Transaction & {
  id: string
  connection: PgClient
  finished?: string
  _afterCommitHooks: ((t: Transaction) => unknown)[]
}

const pendingBegin = new WeakMap<Transaction, Promise<unknown>>()
const committing = new WeakSet<Transaction>()

/** BEGIN's answer, once: preparedQuery awaits it together with the transaction's first statement. */
export function takePendingBegin(t: Transaction): Promise<unknown> | undefined {
  const begin = pendingBegin.get(t)
  pendingBegin.delete(t)
  return begin
}

/**
 * Sends COMMIT right behind `last` (statements already sent) and waits for every answer, the
 * COMMIT's included, so the connection is idle again when it goes back to the pool. The first
 * failure, in the order sent, is thrown.
 */
export async function commitWith<T extends unknown[]>(
  t: Transaction,
  last: [...{ [K in keyof T]: Promise<T[K]> }],
): Promise<T> {
  committing.add(t)
  const commit = (t as HotTransaction).connection.query('COMMIT')
  const settled = await Promise.allSettled([...last, commit])
  const failed = settled.find((s): s is PromiseRejectedResult => s.status === 'rejected')
  if (failed) throw failed.reason
  ;(t as HotTransaction).finished = 'commit'
  return settled.slice(0, -1).map((s) => (s as PromiseFulfilledResult<unknown>).value) as T
}

export async function inPipelinedTransaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  const manager = sequelize.connectionManager as unknown as ConnectionManager
  const t = new Transaction(sequelize, {}) as HotTransaction
  const connection = await manager.getConnection({ uuid: t.id })
  t.connection = connection
  connection.uuid = t.id
  const begin = connection.query('BEGIN')
  begin.catch(() => {}) // awaited with the first statement, or below
  pendingBegin.set(t, begin)
  let healthy = true
  try {
    const result = await fn(t)
    await takePendingBegin(t) // a transaction that sent no statement through preparedQuery
    if (!committing.has(t)) {
      committing.add(t) // from here on, a failure (of an afterCommit hook) is not rolled back
      await connection.query('COMMIT')
    }
    t.finished = 'commit'
    for (const hook of t._afterCommitHooks) await hook(t)
    return result
  } catch (err) {
    // Once the COMMIT was sent, PostgreSQL has ended the transaction either way (a failed
    // statement turns the COMMIT into a ROLLBACK); before, it is rolled back here.
    if (!committing.has(t))
      await connection.query('ROLLBACK').catch(() => {
        healthy = false // a connection that cannot even roll back is not handed out again
      })
    if (t.finished !== 'commit') t.finished = 'rollback'
    throw err
  } finally {
    if (!healthy) connection._invalid = true
    connection.uuid = undefined
    await manager.releaseConnection(connection)
  }
}
