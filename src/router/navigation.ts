/**
 * The navigation drawer, as data. A page appears in a person's drawer only when its route's
 * meta.roles include their role — the same list the router guard checks, so the menu can never
 * offer a page the guard would refuse. To add a page later (lots, review, certificates, trends):
 * add its route in router/index.ts with meta.roles, then one entry below.
 */
import type { RouteLocationRaw, Router } from 'vue-router'
import {
  mdiAccountGroupOutline,
  mdiCertificateOutline,
  mdiAlertOctagonOutline,
  mdiClipboardCheckOutline,
  mdiHistory,
  mdiTagOutline,
  mdiChartTimelineVariant,
  mdiClipboardListOutline,
  mdiCloudUploadOutline,
  mdiCogOutline,
  mdiDomain,
  mdiGauge,
  mdiHomeOutline,
  mdiTextBoxCheckOutline,
} from '@mdi/js'
import type { Role } from '@shared/api/roles'
import { ROUTES, type RouteName } from './routeNames'

export interface NavEntry {
  title: string
  icon: string
  route: RouteName
  /** Shown under the entry, for a first-time reader. */
  hint?: string
}
export interface NavGroup {
  /** null: entries above every heading. */
  heading: string | null
  entries: NavEntry[]
}

export const NAV_GROUPS: NavGroup[] = [
  { heading: null, entries: [{ title: 'Home', icon: mdiHomeOutline, route: ROUTES.home }] },
  {
    heading: 'Coating line',
    entries: [
      {
        title: 'Lots',
        icon: mdiClipboardListOutline,
        route: ROUTES.floorLots,
        hint: 'Open a lot, inspect its parts',
      },
      {
        title: 'Waiting to send',
        icon: mdiCloudUploadOutline,
        route: ROUTES.floorQueue,
        hint: 'Records kept on this tablet',
      },
    ],
  },
  {
    heading: 'QA review',
    entries: [
      {
        title: 'Review queue',
        icon: mdiClipboardCheckOutline,
        route: ROUTES.reviewQueue,
        hint: 'Lots to release, hold or reject',
      },
      {
        title: 'Nonconformances',
        icon: mdiAlertOctagonOutline,
        route: ROUTES.reviewNcs,
        hint: 'Dispositions and closure',
      },
    ],
  },
  {
    heading: 'Certificates',
    entries: [
      {
        title: 'Certificates',
        icon: mdiCertificateOutline,
        route: ROUTES.certificates,
        hint: 'Issue, send, reissue, withdraw',
      },
      {
        title: 'Your certificates',
        icon: mdiCertificateOutline,
        route: ROUTES.portal,
        hint: 'Find and download',
      },
    ],
  },
  {
    heading: 'Plant',
    entries: [
      {
        title: 'Line health',
        icon: mdiChartTimelineVariant,
        route: ROUTES.trends,
        hint: 'Yield, reject causes, thickness capability',
      },
    ],
  },
  {
    heading: 'Setup',
    entries: [
      {
        title: 'Coating specs',
        icon: mdiTextBoxCheckOutline,
        route: ROUTES.setupSpecs,
        hint: 'Bands, prep, holiday, cure',
      },
      {
        title: 'Instruments',
        icon: mdiGauge,
        route: ROUTES.setupInstruments,
        hint: 'Gauges and calibration',
      },
      {
        title: 'Customers',
        icon: mdiDomain,
        route: ROUTES.setupCustomers,
        hint: 'Companies and contacts',
      },
      {
        title: 'People',
        icon: mdiAccountGroupOutline,
        route: ROUTES.setupPeople,
        hint: 'Sign-ins and roles',
      },
      {
        title: 'Defect types',
        icon: mdiTagOutline,
        route: ROUTES.setupDefectTypes,
        hint: 'What a nonconformance is filed under',
      },
      {
        title: 'Audit trail',
        icon: mdiHistory,
        route: ROUTES.setupAudit,
        hint: 'Every change, by person and record',
      },
      { title: 'Plant settings', icon: mdiCogOutline, route: ROUTES.setupSettings },
    ],
  },
]

/** The groups and entries one role may open, in drawer order; empty groups are left out. */
export function navFor(role: Role, router: Router): NavGroup[] {
  return NAV_GROUPS.map((g) => ({
    heading: g.heading,
    entries: g.entries.filter(
      (e) => router.resolve({ name: e.route }).meta.roles?.includes(role) ?? false,
    ),
  })).filter((g) => g.entries.length > 0)
}

/** Where a role lands after sign-in or when it opens a page it may not see. */
export function roleHome(role: Role): RouteLocationRaw {
  // A customer's home is their certificates; every staff role shares one home (HomeView.vue).
  return role === 'customer' ? { name: ROUTES.portal } : { name: ROUTES.home }
}
