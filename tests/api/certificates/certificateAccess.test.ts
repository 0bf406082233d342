/**
 * Who sees which certificate, the customer's search, reissue / revoke, the reopen mark, and the
 * public verification answer (valid → superseded → revoked, nothing else disclosed).
 */
import { describe, expect, it, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { reviewWorld, type ReviewWorld } from '../review/reviewSupport'
import { createCustomerAndSpec } from '../floor/floorSupport'
import { customerUser, getPdf, issue, releasedLot, withContacts } from './certSupport'
import { lotVersion } from '../review/reviewSupport'
import type { CertificateDetail, VerifyResult } from '../../../shared/api/certificates'

const app = createApp()

describe('certificates: customer portal, reissue, revoke and public verification', () => {
  let w: ReviewWorld
  let mine: CertificateDetail
  let theirs: CertificateDetail
  let customerA: { auth: string }
  let lotA: { id: number; lotNumber: string }

  beforeAll(async () => {
    w = await reviewWorld(app)
    await withContacts(w.customerId)
    lotA = await releasedLot(app, w)
    mine = (await issue(app, w.supervisor.auth, lotA.id)).body as CertificateDetail
    // Customer B: another company with its own spec and lot.
    const other = await createCustomerAndSpec()
    const wB = { ...w, customerId: other.customer.id, specId: other.spec.id }
    const lotB = await releasedLot(app, wB)
    theirs = (await issue(app, w.supervisor.auth, lotB.id)).body as CertificateDetail
    customerA = await customerUser(app, w.customerId)
  })

  it('a customer lists only their own company’s certificates', async () => {
    const list = await request(app).get('/api/certificates').set('Authorization', customerA.auth)
    expect(list.status).toBe(200)
    expect(list.body.map((c: { id: number }) => c.id)).toEqual([mine.id])
    // Asking for the other company by filter changes nothing.
    const forced = await request(app)
      .get(`/api/certificates?customerId=${theirs.customerId}&q=${theirs.lotNumber}`)
      .set('Authorization', customerA.auth)
    expect(forced.body).toEqual([])
    const staff = await request(app)
      .get('/api/certificates')
      .set('Authorization', w.supervisor.auth)
    expect(staff.body.map((c: { id: number }) => c.id).sort()).toEqual([mine.id, theirs.id].sort())
  })

  it('another company’s certificate by id answers 404, the same body as one that does not exist', async () => {
    const missingId = theirs.id + 1000
    for (const suffix of ['', '/pdf']) {
      const guessed = await request(app)
        .get(`/api/certificates/${theirs.id}${suffix}`)
        .set('Authorization', customerA.auth)
      const missing = await request(app)
        .get(`/api/certificates/${missingId}${suffix}`)
        .set('Authorization', customerA.auth)
      expect(guessed.status).toBe(404)
      expect(missing.status).toBe(404)
      expect(guessed.body.error.code).toBe(missing.body.error.code)
      expect(guessed.body.error.message.replace(String(theirs.id), 'N')).toBe(
        missing.body.error.message.replace(String(missingId), 'N'),
      )
      const text = JSON.stringify(guessed.body)
      expect(text).not.toContain(theirs.number)
      expect(text).not.toContain(theirs.lotNumber)
      expect(guessed.headers['content-type']).not.toContain('pdf')
    }
    const own = await getPdf(app, customerA.auth, mine.id)
    expect(own.status).toBe(200)
    expect((own.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-')
  })

  it('a customer finds a certificate by order, lot, part or heat number; sees no mail log', async () => {
    for (const q of [
      mine.orderRef,
      mine.lotNumber.slice(-4),
      mine.partNumbers[0]!,
      mine.heatNumbers[0]!,
    ]) {
      const res = await request(app)
        .get(`/api/certificates?q=${encodeURIComponent(q)}`)
        .set('Authorization', customerA.auth)
      expect(
        res.body.map((c: { id: number }) => c.id),
        q,
      ).toEqual([mine.id])
    }
    const none = await request(app)
      .get('/api/certificates?q=no-such-order-xyz')
      .set('Authorization', customerA.auth)
    expect(none.body).toEqual([])
    const detail = await request(app)
      .get(`/api/certificates/${mine.id}`)
      .set('Authorization', customerA.auth)
    expect(detail.body.deliveries).toBeNull()
    const reissue = await request(app)
      .post(`/api/certificates/${mine.id}/revoke`)
      .set('Authorization', customerA.auth)
      .send({ reason: 'Not mine to withdraw' })
    expect(reissue.status).toBe(403)
  })

  it('verify: valid, then superseded after a reissue (pointing at its successor), then revoked', async () => {
    const verify = (code: string) => request(app).get(`/api/verify/${code}`)
    const first = await verify(mine.verifyCode)
    expect(first.status).toBe(200)
    expect(first.body).toEqual<VerifyResult>({
      state: 'valid',
      number: mine.number,
      issuedAt: mine.issuedAt,
      lotNumber: mine.lotNumber,
      fingerprint: mine.fingerprint,
      contentFingerprint: mine.contentFingerprint,
      successor: null,
      revokedAt: null,
    })
    const noReason = await request(app)
      .post(`/api/certificates/${mine.id}/reissue`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: '' })
    expect(noReason.status).toBe(400)
    const re = await request(app)
      .post(`/api/certificates/${mine.id}/reissue`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Customer asked for the order item number on the certificate' })
    expect(re.status).toBe(201)
    const successor = re.body as CertificateDetail
    expect(successor.supersedes).toMatchObject({ id: mine.id, number: mine.number })
    expect(successor.number).not.toBe(mine.number)
    const old = await verify(mine.verifyCode)
    expect(old.body.state).toBe('superseded')
    expect(old.body.successor).toEqual({
      verifyCode: successor.verifyCode,
      verifyUrl: successor.verifyUrl,
    })
    // A superseded certificate cannot be withdrawn or reissued again.
    const again = await request(app)
      .post(`/api/certificates/${mine.id}/reissue`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Second try at the old one' })
    expect(again.status).toBe(409)

    const revoked = await request(app)
      .post(`/api/certificates/${successor.id}/revoke`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Issued against the wrong order' })
    expect(revoked.status).toBe(200)
    expect(revoked.body.state).toBe('revoked')
    const last = await verify(successor.verifyCode)
    expect(last.body.state).toBe('revoked')
    expect(Date.parse(last.body.revokedAt)).toBeGreaterThan(Date.parse(successor.issuedAt) - 1000)
    expect(Object.keys(last.body).sort()).toEqual(
      [
        'contentFingerprint',
        'fingerprint',
        'issuedAt',
        'lotNumber',
        'number',
        'revokedAt',
        'state',
        'successor',
      ].sort(),
    )
    expect(JSON.stringify(last.body)).not.toMatch(/customer|part|order|Water/i)
    const unknown = await verify('AAAAAAAAAAAAAAAAAAAAAA')
    expect(unknown.status).toBe(404)
    // The revoked lot is offered for a fresh certificate again.
    const toIssue = await request(app)
      .get('/api/certificates/lots-to-issue')
      .set('Authorization', w.supervisor.auth)
    expect(toIssue.body.find((l: { lotId: number }) => l.lotId === lotA.id)).toMatchObject({
      hadRevoked: true,
    })
  })

  it('a lot reopened after release marks its certificate as needing reissue', async () => {
    const lot = await releasedLot(app, w)
    const cert = (await issue(app, w.supervisor.auth, lot.id)).body as CertificateDetail
    expect(cert.needsReissue).toBe(false)
    const reopen = await request(app)
      .post(`/api/lots/${lot.id}/reopen`)
      .set('Authorization', w.supervisor.auth)
      .send({
        reason: 'Customer reported a thin flange face',
        version: await lotVersion(app, w, lot.id),
      })
    expect(reopen.status).toBe(200)
    expect(reopen.body.certificatesMarked).toBe(1)
    const after = await request(app)
      .get(`/api/certificates/${cert.id}`)
      .set('Authorization', w.supervisor.auth)
    expect(after.body.needsReissue).toBe(true)
    // While the lot is open again it cannot be certified anew.
    const re = await request(app)
      .post(`/api/certificates/${cert.id}/reissue`)
      .set('Authorization', w.supervisor.auth)
      .send({ reason: 'Reissue before re-release' })
    expect(re.status).toBe(409)
    expect(re.body.error.code).toBe('lot_not_released')
  })

  it('verification is rate limited per address (30 a minute)', async () => {
    let limited = 0
    for (let i = 0; i < 32; i += 1) {
      const res = await request(app).get(`/api/verify/${mine.verifyCode}`)
      if (res.status === 429) limited += 1
    }
    // Earlier tests here used some of the minute's 30; at least the last two are refused.
    expect(limited).toBeGreaterThanOrEqual(2)
  })
})
