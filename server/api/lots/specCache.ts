import type { Transaction } from 'sequelize'
import { getSpecVersion } from '../specs/specs.service'
import { specContentSchema, type SpecContent } from '../../../shared/spec/specContent'
import { parsedSpecForRules } from '../../../shared/rules/evaluatePart'

/**
 * Spec version content by (specId, version). A version a lot uses is locked and never changes
 * again, so it is read from the database once per process. Unlocked versions are not cached.
 */
const cache = new Map<string, SpecContent>()

export async function specContentFor(
  specId: number,
  version: number,
  t?: Transaction,
): Promise<SpecContent> {
  const key = `${specId}:${version}`
  const hit = cache.get(key)
  if (hit) return hit
  const row = await getSpecVersion(specId, version, t)
  // Defaults filled in once, so every reader (and the rules) sees the same complete content.
  // A locked version is frozen and parsed once for the rules too (evaluatePart trusts it).
  const content = row.lockedAt ? parsedSpecForRules(row.content) : specContentSchema.parse(row.content)
  if (row.lockedAt) cache.set(key, content)
  return content
}
