import type { Model, ModelStatic, Transaction } from 'sequelize'

/**
 * A short-lived cache of model rows by id, for reference rows read on every request of a hot
 * path (the signed-in user, a gauge). Every change made through Sequelize in this process drops
 * the entry at once (instance saves, destroys, bulk updates); a row changed inside a transaction
 * is not cached again until that transaction commits (if it rolls back, the row is simply read
 * from the database every time until its next committed change). A change made by another
 * process, or by hand in SQL, is seen within `ttlMs`.
 */
export class RowCache<M extends Model & { id: number }> {
  private readonly rows = new Map<number, { row: M; until: number }>()
  /** Rows changed in a transaction that has not committed yet; undefined = "all rows". */
  private readonly pending = new Set<number | undefined>()
  private generation = 0

  constructor(
    private readonly model: ModelStatic<M>,
    private readonly ttlMs: number,
    private readonly maxEntries = 10_000,
  ) {
    type Opts = { transaction?: Transaction | null }
    const name = `rowCache:${model.name}`
    model.addHook('afterSave', name, (row: M, o: Opts) => this.changed(row.id, o))
    model.addHook('afterDestroy', name, (row: M, o: Opts) => this.changed(row.id, o))
    model.addHook('afterBulkUpdate', name, (o: Opts) => this.changed(undefined, o))
    model.addHook('afterBulkDestroy', name, (o: Opts) => this.changed(undefined, o))
  }

  async get(id: number, transaction?: Transaction): Promise<M | null> {
    const now = Date.now()
    const hit = this.rows.get(id)
    if (hit && hit.until > now) return hit.row
    const seen = this.generation
    const row = (await this.model.findByPk(id, { transaction })) as M | null
    // A change that happened while this read was on its way may not be in it: do not keep it.
    const dirty = this.pending.has(id) || this.pending.has(undefined)
    if (row && seen === this.generation && !dirty) {
      if (this.rows.size >= this.maxEntries) this.rows.clear()
      this.rows.set(id, { row, until: now + this.ttlMs })
    }
    return row
  }

  private forget(id: number | undefined) {
    this.generation += 1
    if (id === undefined) this.rows.clear()
    else this.rows.delete(id)
  }

  private changed(id: number | undefined, options: { transaction?: Transaction | null }) {
    this.forget(id)
    const t = options.transaction
    if (!t) return
    this.pending.add(id)
    t.afterCommit(() => {
      this.pending.delete(id)
      this.forget(id)
    })
  }
}
