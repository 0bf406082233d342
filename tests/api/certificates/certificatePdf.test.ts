/**
 * Issuing a certificate for a released lot: the stored PDF read back says what the lot's records
 * say. Expected thickness statistics are computed here from the gauge_readings rows themselves,
 * not from the server's code; 1 mil = 25.4 µm exactly (TRADE.md intro [R]).
 */
import { describe, expect, it, beforeAll } from 'vitest'
import { createHash } from 'node:crypto'
import request from 'supertest'
import { QueryTypes } from 'sequelize'
import { createApp } from '../../../server/app'
import { sequelize } from '../../../server/db'
import { env } from '../../../server/config/env'
import { reviewWorld, GOOD_SPOTS_UM, inspectedLot, type ReviewWorld } from '../review/reviewSupport'
import { decodeQr, readPdfText, renderPages, rowPattern } from '../../unit/pdf/pdfReading'
import { uuid } from '../floor/floorSupport'
import { getPdf, issue, releaseInspected, withContacts } from './certSupport'
import type { CertificateDetail } from '../../../shared/api/certificates'

const app = createApp()
const MIL = 25.4

/** Part 2's spots: a different spread, so each row is told apart. */
const WIDER_SPOTS_UM = [
  [360, 370, 380],
  [420, 430, 440],
  [400, 395, 405],
  [385, 390, 395],
  [445, 450, 455],
]

async function liveReadingsUm(partId: number): Promise<number[]> {
  const rows = await sequelize.query<{ thickness_um: number }>(
    `SELECT r.thickness_um FROM gauge_readings r JOIN parts p ON p.id = r.part_id AND p.round = r.round
      WHERE r.part_id = $1 AND r.discarded_at IS NULL`,
    { bind: [partId], type: QueryTypes.SELECT },
  )
  return rows.map((r) => r.thickness_um)
}

const mils = (um: number) => (um / MIL).toFixed(1)

describe('certificate of conformance issued for a released lot', () => {
  let w: ReviewWorld
  let lot: { id: number; lotNumber: string; partIds: number[] }
  let cert: CertificateDetail
  let pdf: Buffer

  beforeAll(async () => {
    w = await reviewWorld(app)
    await withContacts(w.customerId, 'mil')
    lot = await inspectedLot(app, w, [GOOD_SPOTS_UM, WIDER_SPOTS_UM])
    // A reading the inspector discarded must not count: 455 µm in part 2's last spot goes, 450 replaces it.
    const [high] = await sequelize.query<{ id: string }>(
      `SELECT id FROM gauge_readings WHERE part_id = $1 AND thickness_um = 455`,
      { bind: [lot.partIds[1]], type: QueryTypes.SELECT },
    )
    const d = await request(app)
      .post(`/api/readings/${high!.id}/discard`)
      .set('Authorization', w.operator.auth)
      .send({ reason: 'Probe landed on a weld spatter' })
    expect(d.status).toBe(200)
    const add = await request(app)
      .post(`/api/parts/${lot.partIds[1]}/readings`)
      .set('Authorization', w.operator.auth)
      .send({
        readings: [
          { clientId: uuid(), areaNo: 1, spotNo: 5, thicknessUm: 448, instrumentId: w.ids.gauge },
        ],
      })
    expect(add.status).toBe(201)
    await releaseInspected(app, w, lot.id)
    const res = await issue(app, w.supervisor.auth, lot.id)
    expect(res.status).toBe(201)
    cert = res.body as CertificateDetail
    const file = await getPdf(app, w.supervisor.auth, cert.id)
    expect(file.status).toBe(200)
    expect(file.headers['content-type']).toBe('application/pdf')
    pdf = file.body as Buffer
  })

  it('prints n, min, mean and max of each part in the customer’s mils, from the readings not discarded', async () => {
    const text = await readPdfText(pdf)
    for (const partId of lot.partIds) {
      const readings = await liveReadingsUm(partId)
      const [part] = await sequelize.query<{
        part_number: string
        heat_number: string
        description: string
      }>('SELECT part_number, heat_number, description FROM parts WHERE id = $1', {
        bind: [partId],
        type: QueryTypes.SELECT,
      })
      const mean = readings.reduce((a, b) => a + b, 0) / readings.length
      expect(text.all).toMatch(
        rowPattern([
          part!.part_number,
          part!.description,
          part!.heat_number,
          '1',
          String(readings.length),
          mils(Math.min(...readings)),
          mils(mean),
          mils(Math.max(...readings)),
          'Pass',
        ]),
      )
    }
    // Worked by hand for part 2: 455 discarded, 448 added → max 450 µm = 17.7 mil; n stays 15.
    expect(text.all).toMatch(rowPattern(['15', '14.2', '16.0', '17.7', 'Pass']))
    expect(text.all).not.toMatch(/17\.9 Pass/) // 455 µm would have printed 17.9
    // The band in mils as the customer reads it: 12–20 mils (the floor spec, TRADE.md §4 [P]).
    expect(text.all).toContain('12.0–20.0 mil')
    expect(text.all).toContain(cert.number)
    expect(text.all).toContain(lot.lotNumber)
    expect(text.all).toContain('EN 10204 type 3.1')
    // The supervisor released it, the operator recorded it.
    expect(text.all).toContain(w.supervisor.user.name)
    expect(text.all).toContain(w.operator.user.name)
    // Holiday test at 2,100 V (NACE SP0490 525 √16, TRADE.md §3 [C]) with the caution beside it.
    expect(text.all).toMatch(/2,100 V/)
    expect(text.all).toMatch(/Caution: high-voltage holiday testers/)
    expect(text.all).toMatch(/SSPC-SP 10 \/ Sa 2½/)
  })

  it('embeds its font (a /FontFile2 TrueType stream, no standard-14 font)', () => {
    const raw = pdf.toString('latin1')
    expect(raw).toContain('/FontFile2')
    expect(raw).not.toMatch(/\/BaseFont\s*\/Helvetica/)
  })

  it('carries a QR code that opens this certificate’s public verification page', async () => {
    const [page1] = await renderPages(pdf, 150, { first: 1, last: 1 })
    const url = await decodeQr(page1!)
    expect(url).toBe(`${env.PUBLIC_URL}/verify/${cert.verifyCode}`)
    expect(cert.verifyCode).toMatch(/^[A-Za-z0-9_-]{22}$/)
    // 16 random bytes (128 bits), not derived from the id or the number.
    expect(Buffer.from(cert.verifyCode, 'base64url')).toHaveLength(16)
  }, 60_000) // pdftoppm + sharp + jsQR: seconds on a busy machine

  it('stores the bytes and the file fingerprint at issue; the PDF is served as stored, never rebuilt', async () => {
    expect(cert.fingerprint).toBe(createHash('sha256').update(pdf).digest('hex'))
    const again = await getPdf(app, w.admin.auth, cert.id)
    expect(Buffer.compare(again.body as Buffer, pdf)).toBe(0)
    const text = await readPdfText(pdf)
    expect(text.all.replace(/\s+/g, '')).toContain(cert.contentFingerprint)
    // The database itself refuses to change the stored PDF.
    await expect(
      sequelize.query("UPDATE certificates SET pdf = '\\x00' WHERE id = $1", { bind: [cert.id] }),
    ).rejects.toThrow(/evidence/)
    await expect(
      sequelize.query('DELETE FROM certificates WHERE id = $1', { bind: [cert.id] }),
    ).rejects.toThrow(/never deleted/)
  })

  it('numbers certificates in our own scheme and writes an audit event', async () => {
    expect(cert.number).toMatch(/^[A-Z]{1,4}-C-\d{2}-\d{5}$/)
    const [event] = await sequelize.query<{ action: string; actor_id: number }>(
      `SELECT action, actor_id FROM audit_events WHERE entity_type = 'certificate' AND entity_id = $1`,
      { bind: [String(cert.id)], type: QueryTypes.SELECT },
    )
    expect(event).toEqual({ action: 'certificate.issue', actor_id: w.supervisor.user.id })
  })

  it('refuses a second certificate for the lot, an unreleased lot and an operator', async () => {
    const twice = await issue(app, w.supervisor.auth, lot.id)
    expect(twice.status).toBe(409)
    expect(twice.body.error.code).toBe('already_certified')
    const open = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    const notReleased = await issue(app, w.supervisor.auth, open.id)
    expect(notReleased.status).toBe(409)
    expect(notReleased.body.error.code).toBe('lot_not_released')
    const operator = await issue(app, w.operator.auth, lot.id)
    expect(operator.status).toBe(403)
  })

  it('type 2.1 prints no results (EN 10204, TRADE.md §7 [R])', async () => {
    const other = await inspectedLot(app, w, [GOOD_SPOTS_UM])
    await releaseInspected(app, w, other.id)
    const res = await issue(app, w.admin.auth, other.id, '2.1')
    expect(res.status).toBe(201)
    const text = await readPdfText((await getPdf(app, w.admin.auth, res.body.id)).body as Buffer)
    expect(text.all).toContain('EN 10204 type 2.1')
    expect(text.all).not.toMatch(/2,100 V/)
    expect(text.all).not.toMatch(/Mean mil/)
  })
})
