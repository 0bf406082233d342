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
} as const

export type RouteName = (typeof ROUTES)[keyof typeof ROUTES]
