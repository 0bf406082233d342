import bcrypt from 'bcryptjs'
import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'
import { User } from '../../db/models'
import { HttpError } from '../../lib/httpError'
import { signToken, toSessionUser } from '../../middleware/auth'
import type { LoginResponse } from '../../../shared/api/auth'

/** After this many failed sign-ins in a row the account waits LOCK_MINUTES. */
export const MAX_FAILED_LOGINS = 5
export const LOCK_MINUTES = 15
export const BCRYPT_COST = 10

// Compared against when the e-mail is unknown, so both paths take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password-0', BCRYPT_COST)

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST)
}

const refused = () => new HttpError(401, 'bad_credentials', 'E-mail or password is not right')

function lockedAnswer(lockedUntil: Date) {
  const minutes = Math.ceil((lockedUntil.getTime() - Date.now()) / 60000)
  return new HttpError(
    423,
    'account_locked',
    `Too many failed sign-ins: this account is locked for ${minutes} more minute(s), or until an admin resets its password`,
  )
}

/**
 * Sign-in. An address with no account is answered exactly as a real one with a wrong password:
 * the same time (a bcrypt compare either way), the same 401, and after MAX_FAILED_LOGINS the
 * same 423 (counted in sign_in_failures_unknown). While locked, the password is not compared
 * with the real hash at all, so the answer never tells whether a guess was right.
 */
export async function login(email: string, password: string): Promise<LoginResponse> {
  const address = email.toLowerCase()
  const user = await User.findOne({ where: { email: address } })
  if (!user) return refuseUnknown(address, password)
  if (user.lockedUntil && user.lockedUntil > new Date()) {
    await bcrypt.compare(password, DUMMY_HASH)
    throw lockedAnswer(user.lockedUntil)
  }
  const ok = await bcrypt.compare(password, user.passwordHash)
  if (!ok || !user.active) {
    if (ok && !user.active)
      throw new HttpError(401, 'deactivated', 'This account has been deactivated')
    const failedLogins = user.failedLogins + 1
    const lockedUntil =
      failedLogins >= MAX_FAILED_LOGINS ? new Date(Date.now() + LOCK_MINUTES * 60000) : null
    await user.update({ failedLogins: lockedUntil ? 0 : failedLogins, lockedUntil })
    throw refused()
  }
  await user.update({ failedLogins: 0, lockedUntil: null, lastLoginAt: new Date() })
  return { token: signToken(user), user: toSessionUser(user) }
}

async function refuseUnknown(address: string, password: string): Promise<never> {
  const [row] = await sequelize.query<{ locked_until: Date | null }>(
    'SELECT locked_until FROM sign_in_failures_unknown WHERE email = $1',
    { bind: [address], type: QueryTypes.SELECT },
  )
  await bcrypt.compare(password, DUMMY_HASH)
  if (row?.locked_until && row.locked_until > new Date()) throw lockedAnswer(row.locked_until)
  // The same counting as a user row: the streak resets to 0 when it locks.
  await sequelize.query(
    `WITH pruned AS (
       DELETE FROM sign_in_failures_unknown
        WHERE last_failed_at < now() - interval '1 day' AND coalesce(locked_until, now()) <= now()
          AND email <> $1)
     INSERT INTO sign_in_failures_unknown AS f (email, failed_logins, locked_until)
     VALUES ($1, CASE WHEN $2::int <= 1 THEN 0 ELSE 1 END,
             CASE WHEN $2::int <= 1 THEN now() + make_interval(mins => $3::int) END)
     ON CONFLICT (email) DO UPDATE SET
       failed_logins = CASE WHEN f.failed_logins + 1 >= $2::int THEN 0 ELSE f.failed_logins + 1 END,
       locked_until = CASE WHEN f.failed_logins + 1 >= $2::int
                           THEN now() + make_interval(mins => $3::int) END,
       last_failed_at = now()`,
    { bind: [address, MAX_FAILED_LOGINS, LOCK_MINUTES] },
  )
  throw refused()
}
