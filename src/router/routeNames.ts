/** Every route's name, typed: `{ name: ROUTES.setupSpecs }` fails to compile when misspelt. */
export const ROUTES = {
  signIn: 'sign-in',
  home: 'home',
  setupPeople: 'setup-people',
  setupCustomers: 'setup-customers',
  setupSpecs: 'setup-specs',
  setupSpecNew: 'setup-spec-new',
  setupSpecDetail: 'setup-spec-detail',
  setupSpecEdit: 'setup-spec-edit',
  setupInstruments: 'setup-instruments',
  setupSettings: 'setup-settings',
  // Coating line (the tablet at the line): lots, parts, readings, the send-later list.
  floorLots: 'floor-lots',
  floorLotNew: 'floor-lot-new',
  floorLot: 'floor-lot',
  floorPart: 'floor-part',
  floorQueue: 'floor-queue',
  // Line health (trends) for plant managers.
  trends: 'trends',
  // Certificates of conformance: staff list and page, the customer portal, public verification.
  certificates: 'certificates',
  certificate: 'certificate',
  portal: 'portal',
  verify: 'verify',
  // QA review: the queue, a lot's evidence and decision, nonconformances, a lot's history.
  reviewQueue: 'review-queue',
  reviewLot: 'review-lot',
  reviewLotHistory: 'review-lot-history',
  reviewNcs: 'review-ncs',
  reviewNc: 'review-nc',
  setupDefectTypes: 'setup-defect-types',
  setupAudit: 'setup-audit',
} as const

export type RouteName = (typeof ROUTES)[keyof typeof ROUTES]
