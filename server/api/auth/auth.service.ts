import bcrypt from 'bcryptjs'
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

export async function login(email: string, password: string): Promise<LoginResponse> {
  const user = await User.findOne({ where: { email: email.toLowerCase() } })
  if (!user) {
    await bcrypt.compare(password, DUMMY_HASH)
    throw refused()
  }
  if (user.lockedUntil && user.lockedUntil > new Date()) {
    const minutes = Math.ceil((user.lockedUntil.getTime() - Date.now()) / 60000)
    throw new HttpError(
      423,
      'account_locked',
      `Too many failed sign-ins: this account is locked for ${minutes} more minute(s), or until an admin resets its password`,
    )
  }
  const ok = await bcrypt.compare(password, user.passwordHash)
  if (!ok || !user.active) {
    if (ok && !user.active) throw new HttpError(401, 'deactivated', 'This account has been deactivated')
    const failedLogins = user.failedLogins + 1
    const lockedUntil = failedLogins >= MAX_FAILED_LOGINS ? new Date(Date.now() + LOCK_MINUTES * 60000) : null
    await user.update({ failedLogins: lockedUntil ? 0 : failedLogins, lockedUntil })
    throw refused()
  }
  await user.update({ failedLogins: 0, lockedUntil: null, lastLoginAt: new Date() })
  return { token: signToken(user), user: toSessionUser(user) }
}
