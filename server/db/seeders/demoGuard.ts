import bcrypt from 'bcryptjs'
import { User } from '../models'
import { DEMO_PASSWORD } from './demoPassword'

/** In production the server refuses to start while any demo account still has the demo password. */
export async function refuseDemoPasswordsInProduction() {
  const users = await User.findAll({ where: { active: true } })
  const exposed: string[] = []
  for (const u of users) if (await bcrypt.compare(DEMO_PASSWORD, u.passwordHash)) exposed.push(u.email)
  if (exposed.length > 0) {
    throw new Error(
      `Refusing to start in production: these accounts still have the demo password: ${exposed.join(', ')}. ` +
        'Reset their passwords (Setup → People) or deactivate them first.',
    )
  }
}
