import request from 'supertest'
import type { Express } from 'express'
import { FBE_SPEC, lotBody, partBody, spotReadings, uuid } from '../floor/floorSupport'
import { addDays, localIsoDate } from '../../../shared/api/calibration'
import type { WorldIds } from './securityWorld'

/**
 * A valid request for every write route: the bad-input test replaces one field at a time with a
 * hostile value, so each value reaches as deep as the schema lets it. Each call makes a fresh
 * body (new clientIds, the record's current version). `null`: the route takes no JSON body
 * (multipart uploads: uploads.test.ts). A new write route needs an entry here.
 */
export interface SampleContext {
  app: Express
  ids: WorldIds & {
    submittedLot: number
    openLot2: number
    thermometer: number
    /** Released lots and certificates of their own, so one route's step does not block another's. */
    lotForReopen: number
    lotForCertificate: number
    certificateForRevoke: number
    certificateForResend: number
  }
  auth: string
}
export interface Sample {
  /** The path when fillPath's default is not the useful one (e.g. another section or lot). */
  path?: (ids: SampleContext['ids']) => string
  body: (ctx: SampleContext) => Promise<Record<string, unknown>> | Record<string, unknown>
  /** The control's status when a 2xx cannot be had twice (a one-time step): the record's state answers. */
  control?: number
}

async function versionOf(ctx: SampleContext, path: string): Promise<number> {
  const res = await request(ctx.app).get(path).set('Authorization', ctx.auth)
  return (res.body.version as number | undefined) ?? 1
}

const today = localIsoDate()
const fresh = () => uuid().slice(0, 8)

export const SAMPLES: Record<string, Sample | null> = {
  // An unknown account: a real one would lock after five hostile passwords (signIn.test.ts).
  'POST /api/auth/login': {
    control: 401,
    body: () => ({ email: 'nobody@test.example', password: 'not-it-123' }),
  },
  'PATCH /api/auth/me/preferences': {
    body: () => ({ thicknessUnit: 'mil', temperatureUnit: 'F', areaUnit: 'ft2' }),
  },
  'POST /api/users': {
    body: () => ({
      email: `fuzz-${fresh()}@test.example`,
      name: 'Fuzz Operator',
      role: 'operator',
      password: 'fuzz-pass-1234',
    }),
  },
  'PATCH /api/users/:id': {
    body: () => ({ name: 'Bystander Operator', role: 'operator', active: true }),
  },
  'POST /api/users/:id/reset-password': { body: () => ({ password: 'fuzz-pass-5678' }) },
  'POST /api/customers': {
    body: () => ({
      name: 'Fuzz Water Board',
      code: `FZ${fresh().toUpperCase()}`,
      address: '1 Reservoir Lane',
      thicknessUnit: 'um',
      contacts: [{ name: 'Fuzz QA', email: `fz-${fresh()}@water.example` }],
    }),
  },
  'PATCH /api/customers/:id': {
    body: () => ({
      name: 'Fuzzed Water',
      address: '2 Weir Road',
      thicknessUnit: 'um',
      active: true,
    }),
  },
  'POST /api/customers/:id/contacts': {
    body: () => ({
      name: 'Fuzz Desk',
      email: `c-${fresh()}@water.example`,
      receivesCertificates: true,
    }),
  },
  'PATCH /api/customers/:id/contacts/:contactId': {
    body: () => ({ name: 'Works QA desk', receivesCertificates: true, active: true }),
  },
  'POST /api/specs': {
    body: () => ({ code: `FZ-${fresh()}`, title: 'Fuzz FBE', customerId: null, content: FBE_SPEC }),
  },
  'PUT /api/specs/:id': {
    body: () => ({ title: 'Test FBE', content: FBE_SPEC, changeNote: 'fuzz' }),
  },
  'POST /api/instruments': {
    body: () => ({
      kind: 'dft-gauge-type2',
      serial: `FZ-${fresh()}`,
      description: 'Fuzz gauge',
      calibratedOn: addDays(today, -30),
      calibrationDueOn: addDays(today, 300),
      certificateRef: 'CAL-1',
    }),
  },
  'PATCH /api/instruments/:id': {
    body: () => ({ description: 'Line 1 gauge', calibrationDueOn: addDays(today, 200) }),
  },
  'PUT /api/settings': {
    body: () => ({
      allowRecorderToRelease: false,
      plantName: 'Harrowgate Flow Works — Coating Shop',
      plantAddress: 'Mill Road',
    }),
  },
  'POST /api/lots': {
    body: ({ ids }) => lotBody(ids.customer, ids.spec, { notes: 'Fuzz lot', parts: [partBody()] }),
  },
  'PATCH /api/lots/:id': {
    body: async (ctx) => ({
      orderRef: 'PO-FUZZ',
      shift: '2',
      batchExpiresOn: addDays(today, 60),
      notes: 'Edited',
      version: await versionOf(ctx, `/api/lots/${ctx.ids.lot}`),
    }),
  },
  'POST /api/lots/:id/parts': { body: () => partBody() },
  'PATCH /api/parts/:id': {
    body: async (ctx) => ({
      description: 'Gate valve body',
      quantity: 2,
      coatedAreaM2: 0.8,
      version: await versionOf(ctx, `/api/parts/${ctx.ids.part}`),
    }),
  },
  'PUT /api/parts/:id/sections/:section': {
    path: (ids) => `/api/parts/${ids.part}/sections/climate`,
    body: ({ ids }) => ({
      clientId: uuid(),
      instrumentId: ids.thermometer,
      data: { airTempC: 20, relativeHumidityPct: 60, steelTempC: 25 },
    }),
  },
  'POST /api/parts/:id/readings': {
    body: ({ ids }) => ({ readings: spotReadings(ids.instrument, [[400, 401, 399]], 1, 6) }),
  },
  'POST /api/readings/:id/discard': { body: () => ({ reason: 'Gauge knocked on the flange' }) },
  'POST /api/instruments/:id/verifications': {
    body: () => ({
      clientId: uuid(),
      referenceNominalUm: 250,
      toleranceUm: 5,
      readingUm: 251,
      occasion: 'start-of-shift',
    }),
  },
  'POST /api/parts/:id/photos': null,
  'POST /api/lots/:id/photos': null,
  'POST /api/nonconformances/:id/photos': null,
  'POST /api/lots/:id/submit': {
    path: (ids) => `/api/lots/${ids.openLot2}/submit`,
    body: async (ctx) => ({ version: await versionOf(ctx, `/api/lots/${ctx.ids.openLot2}`) }),
  },
  'POST /api/lots/:id/decisions': {
    path: (ids) => `/api/lots/${ids.submittedLot}/decisions`,
    body: async (ctx) => ({
      decision: 'hold',
      reason: 'Waiting for the DSC result',
      version: await versionOf(ctx, `/api/lots/${ctx.ids.submittedLot}`),
    }),
  },
  'POST /api/lots/:id/reopen': {
    path: (ids) => `/api/lots/${ids.lotForReopen}/reopen`,
    body: async (ctx) => ({
      reason: 'Customer asked for the cure chart',
      version: await versionOf(ctx, `/api/lots/${ctx.ids.lotForReopen}`),
    }),
  },
  'POST /api/nonconformances': {
    body: ({ ids }) => ({
      lotId: ids.lot,
      partIds: [ids.part],
      defectTypeId: ids.defectType,
      description: 'Sag on the bore',
    }),
  },
  'POST /api/nonconformances/:id/disposition': {
    body: async (ctx) => ({
      disposition: 'use-as-is',
      concessionRef: 'CR-2291',
      note: 'Customer accepts the run on a non-sealing face',
      version: await versionOf(ctx, `/api/nonconformances/${ctx.ids.nonconformance}`),
    }),
  },
  'POST /api/nonconformances/:id/close': {
    body: async (ctx) => ({
      verification: 'Retested, DFT in band',
      version: await versionOf(ctx, `/api/nonconformances/${ctx.ids.nonconformance}`),
    }),
  },
  'POST /api/defect-types': {
    body: () => ({ code: `fz-${fresh()}`, label: 'Fuzz defect', active: true }),
  },
  'PATCH /api/defect-types/:id': { body: () => ({ label: 'Run or sag', active: true }) },
  'POST /api/lots/:id/certificates': {
    path: (ids) => `/api/lots/${ids.lotForCertificate}/certificates`,
    body: () => ({ kind: '3.1' }),
  },
  'POST /api/certificates/:id/reissue': {
    body: () => ({ reason: 'Order number corrected', kind: '3.1' }),
  },
  'POST /api/certificates/:id/revoke': {
    path: (ids) => `/api/certificates/${ids.certificateForRevoke}/revoke`,
    body: () => ({ reason: 'Issued against the wrong order' }),
  },
  'POST /api/certificates/:id/resend': {
    path: (ids) => `/api/certificates/${ids.certificateForResend}/resend`,
    body: async (ctx) => {
      const cert = await request(ctx.app)
        .get(`/api/certificates/${ctx.ids.certificateForResend}`)
        .set('Authorization', ctx.auth)
      return { deliveryId: (cert.body.deliveries as { id: number }[])[0]!.id }
    },
  },
}
