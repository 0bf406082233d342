export const ROLES = ['operator', 'supervisor', 'manager', 'admin', 'customer'] as const
export type Role = (typeof ROLES)[number]

/** Roles grouped the way routes and menus use them. */
export const STAFF: Role[] = ['operator', 'supervisor', 'manager', 'admin']
export const FLOOR: Role[] = ['operator', 'supervisor']
export const QA: Role[] = ['supervisor', 'admin']
export const ADMIN: Role[] = ['admin']

export const ROLE_LABELS: Record<Role, string> = {
  operator: 'Coating operator',
  supervisor: 'QA supervisor',
  manager: 'Plant manager',
  admin: 'Administrator',
  customer: 'Customer',
}
