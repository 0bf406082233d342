import { QueryTypes } from 'sequelize'
import { sequelize } from '../index'
import { Lot, User } from '../models'
import { createCertificate } from '../../api/certificates/certificates.service'
import { count, type Seeder } from './seeder'

const HOUR = 3600_000
/** How many of the most recently released demo lots get a certificate. */
const CERTIFIED_LOTS = 8

/**
 * Certificates for the demo: the most recently released lots get one each, issued by the
 * supervisor who released them an hour after the release; the oldest of them was reissued the
 * next day (so the verification page can show "replaced"). Their e-mails are queued like any
 * other, so the first start delivers them to the local mailbox. A lot that already has a
 * certificate is left alone; the step runs once.
 */
export const certificatesSeeder: Seeder = {
  name: 'certificates',
  once: true,
  async run(ctx) {
    const { t } = ctx
    const lots = await sequelize.query<{ id: number; decided_by: number; decided_at: Date }>(
      `SELECT l.id, d.decided_by, d.decided_at
         FROM lots l
         CROSS JOIN LATERAL (SELECT decided_by, decided_at FROM lot_decisions
                              WHERE lot_id = l.id AND decision = 'release' ORDER BY id DESC LIMIT 1) d
        WHERE l.status = 'released' AND NOT EXISTS (SELECT 1 FROM certificates c WHERE c.lot_id = l.id)
        ORDER BY d.decided_at DESC, l.id DESC LIMIT $1`,
      { bind: [CERTIFIED_LOTS], type: QueryTypes.SELECT, transaction: t },
    )
    // Oldest first, so the numbers rise with the issue dates.
    for (const [i, row] of [...lots].reverse().entries()) {
      const lot = await Lot.findByPk(row.id, { lock: t.LOCK.UPDATE, transaction: t })
      const actor = await User.findByPk(row.decided_by, { transaction: t })
      if (!lot || !actor) continue
      // An hour after the release, but never in the future (a lot released just now).
      const issuedAt = new Date(Math.min(Date.now(), new Date(row.decided_at).getTime() + HOUR))
      const first = await createCertificate(actor, lot, '3.1', t, null, issuedAt)
      count(ctx, 'certificates', true)
      if (i === 0 && lots.length > 1) {
        await createCertificate(
          actor,
          lot,
          '3.1',
          t,
          {
            id: first.id,
            number: first.number,
            reason: 'The customer asked for the order item number beside the order reference',
          },
          new Date(Math.min(Date.now(), issuedAt.getTime() + 24 * HOUR)),
        )
        count(ctx, 'certificates', true)
      }
    }
  },
}
