import { User } from '../db/models'
import { RowCache } from '../lib/rowCache'

/**
 * The signed-in user's row for each API request, kept for USER_CACHE_MS instead of read on every
 * request (one database round trip in nine on the readings path).
 *
 * Trade-off: a change to a user made through the app in this process (deactivation, password
 * reset raising tokenVersion, role change) takes effect on the very next request; one made by
 * another server process on the same database, or by hand in SQL, within USER_CACHE_MS. The
 * token's version and the active flag are still checked against the (cached) row every time.
 */
export const USER_CACHE_MS = 2000
const users = new RowCache(User, USER_CACHE_MS)

export function findSignedInUser(id: number): Promise<User | null> {
  return users.get(id)
}
