import { isDeepStrictEqual } from 'node:util'
import { Op, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction } from '../../db'
import { CoatingSpec, Customer, SpecVersion, User } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict, notFound } from '../../lib/httpError'
import type {
  SpecDetail,
  SpecRow,
  SpecVersionRow,
  createSpecSchema,
  updateSpecSchema,
} from '../../../shared/api/setup'

type CreateSpecBody = z.infer<typeof createSpecSchema>
type UpdateSpecBody = z.infer<typeof updateSpecSchema>
type SpecWithCustomer = CoatingSpec & { customer?: Customer | null }

/** Who wrote each version, by id: SpecVersion.createdBy has no association of its own. */
async function authorNames(versions: SpecVersion[], t?: Transaction): Promise<Map<number, string>> {
  const ids = [
    ...new Set(versions.map((v) => v.createdBy).filter((id): id is number => id !== null)),
  ]
  if (ids.length === 0) return new Map()
  const users = await User.findAll({
    where: { id: { [Op.in]: ids } },
    attributes: ['id', 'name'],
    transaction: t,
  })
  return new Map(users.map((u) => [u.id, u.name]))
}

function toVersionRow(v: SpecVersion, names: Map<number, string>): SpecVersionRow {
  return {
    version: v.version,
    content: v.content,
    changeNote: v.changeNote,
    createdAt: v.createdAt.toISOString(),
    createdByName: v.createdBy === null ? null : (names.get(v.createdBy) ?? null),
    lockedAt: v.lockedAt ? v.lockedAt.toISOString() : null,
  }
}

function toSpecRow(
  spec: SpecWithCustomer,
  current: SpecVersion,
  names: Map<number, string>,
): SpecRow {
  return {
    id: spec.id,
    code: spec.code,
    title: spec.title,
    customerId: spec.customerId,
    customerName: spec.customer?.name ?? null,
    currentVersion: spec.currentVersion,
    active: spec.active,
    current: toVersionRow(current, names),
  }
}

const withCustomer = { include: [{ model: Customer, as: 'customer' }] }

export async function listSpecs(): Promise<SpecRow[]> {
  const specs = await CoatingSpec.findAll({ ...withCustomer, order: [['code', 'ASC']] })
  if (specs.length === 0) return []
  const currents = await SpecVersion.findAll({
    where: { [Op.or]: specs.map((s) => ({ specId: s.id, version: s.currentVersion })) },
  })
  const bySpec = new Map(currents.map((v) => [v.specId, v]))
  const names = await authorNames(currents)
  return specs.flatMap((s) => {
    const current = bySpec.get(s.id)
    return current ? [toSpecRow(s, current, names)] : []
  })
}

export async function getSpecDetail(id: number, t?: Transaction): Promise<SpecDetail> {
  const spec = await CoatingSpec.findByPk(id, { ...withCustomer, transaction: t })
  if (!spec) throw notFound('Coating spec')
  const versions = await SpecVersion.findAll({
    where: { specId: id },
    order: [['version', 'ASC']],
    transaction: t,
  })
  const current = versions.find((v) => v.version === spec.currentVersion)
  if (!current)
    throw new Error(`Spec ${spec.code} has no row for its current version ${spec.currentVersion}`)
  const names = await authorNames(versions, t)
  return {
    ...toSpecRow(spec, current, names),
    versions: versions.map((v) => toVersionRow(v, names)),
  }
}

/** One version of a spec, for a lot or a certificate that must show exactly what it was judged by. */
export async function getSpecVersion(
  specId: number,
  version: number,
  t?: Transaction,
): Promise<SpecVersion> {
  const row = await SpecVersion.findOne({ where: { specId, version }, transaction: t })
  if (!row) throw notFound(`Version ${version} of coating spec #${specId}`)
  return row
}

export async function getSpecVersionRow(specId: number, version: number): Promise<SpecVersionRow> {
  const row = await getSpecVersion(specId, version)
  return toVersionRow(row, await authorNames([row]))
}

/**
 * Freezes a version once a lot is inspected against it; from then on PUT /api/specs/:id makes a
 * new version instead of editing this one. Call it inside the lot's transaction and read the
 * content from the row it returns: the row lock orders it against a concurrent edit in place.
 */
export async function lockSpecVersion(
  specId: number,
  version: number,
  t: Transaction,
  actor: AuditActor | null = null,
): Promise<SpecVersion> {
  const row = await SpecVersion.findOne({
    where: { specId, version },
    lock: t.LOCK.UPDATE,
    transaction: t,
  })
  if (!row) throw notFound(`Version ${version} of coating spec #${specId}`)
  if (row.lockedAt) return row
  const before = snapshot(row)
  await row.update({ lockedAt: new Date() }, { transaction: t })
  await recordAudit(t, actor, {
    action: 'spec-version.lock',
    entityType: 'spec-version',
    entityId: row.id,
    before,
    after: row,
  })
  return row
}

async function assertCustomerExists(customerId: number | null, t: Transaction) {
  if (customerId === null) return
  if (!(await Customer.findByPk(customerId, { transaction: t }))) {
    const message = `Customer #${customerId} does not exist`
    throw new HttpError(400, 'invalid_reference', message, [{ field: 'body.customerId', message }])
  }
}

export async function createSpec(actor: AuditActor, body: CreateSpecBody): Promise<SpecDetail> {
  return inTransaction(async (t) => {
    const taken = await CoatingSpec.findOne({ where: { code: body.code }, transaction: t })
    if (taken)
      throw conflict(
        'duplicate_spec',
        `A coating spec with the code ${body.code} already exists (${taken.title})`,
      )
    await assertCustomerExists(body.customerId, t)
    const spec = await CoatingSpec.create(
      { code: body.code, title: body.title, customerId: body.customerId, currentVersion: 1 },
      { transaction: t },
    )
    const v1 = await SpecVersion.create(
      {
        specId: spec.id,
        version: 1,
        content: body.content,
        changeNote: 'First version',
        createdBy: actor.id,
        lockedAt: null,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'spec.create',
      entityType: 'coating-spec',
      entityId: spec.id,
      after: { spec: snapshot(spec), version: snapshot(v1) },
    })
    return getSpecDetail(spec.id, t)
  })
}

/**
 * Changes a spec. While no lot uses the current version it is edited in place; once locked, new
 * content becomes version N+1 and the old version stays exactly as the lots saw it.
 * The same content again changes only the title (no empty new version).
 */
export async function updateSpec(
  actor: AuditActor,
  id: number,
  body: UpdateSpecBody,
): Promise<SpecDetail> {
  return inTransaction(async (t) => {
    const spec = await CoatingSpec.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!spec) throw notFound('Coating spec')
    const current = await getSpecVersionForUpdate(id, spec.currentVersion, t)
    const before = { spec: snapshot(spec), version: snapshot(current) }
    const contentChanged = !isDeepStrictEqual(current.content, body.content)
    const titleChanged = body.title !== undefined && body.title !== spec.title
    if (!contentChanged && !titleChanged) return getSpecDetail(id, t)

    let action = 'spec.update'
    let version = current
    if (contentChanged && current.lockedAt) {
      action = 'spec.new-version'
      version = await SpecVersion.create(
        {
          specId: id,
          version: spec.currentVersion + 1,
          content: body.content,
          changeNote: body.changeNote,
          createdBy: actor.id,
          lockedAt: null,
        },
        { transaction: t },
      )
      await spec.update({ currentVersion: version.version }, { transaction: t })
    } else if (contentChanged) {
      action = 'spec.edit-in-place'
      await current.update(
        { content: body.content, changeNote: body.changeNote || current.changeNote },
        { transaction: t },
      )
    }
    if (titleChanged) await spec.update({ title: body.title }, { transaction: t })
    await recordAudit(t, actor, {
      action,
      entityType: 'coating-spec',
      entityId: id,
      before,
      after: { spec: snapshot(spec), version: snapshot(version) },
      note: body.changeNote,
    })
    return getSpecDetail(id, t)
  })
}

async function getSpecVersionForUpdate(specId: number, version: number, t: Transaction) {
  const row = await SpecVersion.findOne({
    where: { specId, version },
    lock: t.LOCK.UPDATE,
    transaction: t,
  })
  if (!row) throw new Error(`Spec #${specId} has no row for its current version ${version}`)
  return row
}
