import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router'
import { ADMIN, FLOOR, QA, STAFF, type Role } from '@shared/api/roles'
import { TRENDS_ROLES } from '@shared/api/trends'
import { CERTIFICATE_STAFF, CERTIFICATE_READERS } from '@shared/api/certificates'
import { useSessionStore } from '@/stores/session'
import { ROUTES } from './routeNames'
import { roleHome } from './navigation'

/** The lot review page: QA decides there; a plant manager may read the evidence. */
const REVIEW_READERS: Role[] = [...QA, 'manager']

declare module 'vue-router' {
  interface RouteMeta {
    /** Who may open the page; absent only on public pages. */
    roles?: readonly Role[]
    public?: boolean
    title?: string
  }
}

const routes: RouteRecordRaw[] = [
  {
    path: '/sign-in',
    name: ROUTES.signIn,
    component: () => import('@/views/SignInView.vue'),
    meta: { public: true, title: 'Sign in' },
  },
  {
    path: '/',
    name: ROUTES.home,
    component: () => import('@/views/HomeView.vue'),
    // A customer's home is the portal (roleHome): the guard sends them there.
    meta: { roles: STAFF, title: 'Home' },
  },
  {
    path: '/setup',
    meta: { roles: ADMIN },
    children: [
      { path: '', redirect: { name: ROUTES.setupSpecs } },
      {
        path: 'people',
        name: ROUTES.setupPeople,
        component: () => import('@/views/setup/SetupPeopleView.vue'),
        meta: { roles: ADMIN, title: 'People' },
      },
      {
        path: 'customers',
        name: ROUTES.setupCustomers,
        component: () => import('@/views/setup/SetupCustomersView.vue'),
        meta: { roles: ADMIN, title: 'Customers' },
      },
      {
        path: 'specs',
        name: ROUTES.setupSpecs,
        component: () => import('@/views/setup/SetupSpecsView.vue'),
        meta: { roles: ADMIN, title: 'Coating specs' },
      },
      {
        path: 'specs/new',
        name: ROUTES.setupSpecNew,
        component: () => import('@/views/setup/SpecEditView.vue'),
        meta: { roles: ADMIN, title: 'New coating spec' },
      },
      {
        path: 'specs/:id(\\d+)',
        name: ROUTES.setupSpecDetail,
        component: () => import('@/views/setup/SpecDetailView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: ADMIN, title: 'Coating spec' },
      },
      {
        path: 'specs/:id(\\d+)/edit',
        name: ROUTES.setupSpecEdit,
        component: () => import('@/views/setup/SpecEditView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: ADMIN, title: 'Edit coating spec' },
      },
      {
        path: 'instruments',
        name: ROUTES.setupInstruments,
        component: () => import('@/views/setup/SetupInstrumentsView.vue'),
        meta: { roles: ADMIN, title: 'Instruments' },
      },
      {
        path: 'defect-types',
        name: ROUTES.setupDefectTypes,
        component: () => import('@/views/setup/SetupDefectTypesView.vue'),
        meta: { roles: ADMIN, title: 'Defect types' },
      },
      {
        path: 'audit',
        name: ROUTES.setupAudit,
        component: () => import('@/views/setup/SetupAuditView.vue'),
        meta: { roles: ADMIN, title: 'Audit trail' },
      },
      {
        path: 'settings',
        name: ROUTES.setupSettings,
        component: () => import('@/views/setup/SetupSettingsView.vue'),
        meta: { roles: ADMIN, title: 'Plant settings' },
      },
    ],
  },
  {
    path: '/line',
    meta: { roles: STAFF },
    children: [
      { path: '', redirect: { name: ROUTES.floorLots } },
      {
        path: 'lots',
        name: ROUTES.floorLots,
        component: () => import('@/views/floor/FloorLotsView.vue'),
        meta: { roles: STAFF, title: 'Lots' },
      },
      {
        path: 'lots/new',
        name: ROUTES.floorLotNew,
        component: () => import('@/views/floor/FloorLotNewView.vue'),
        meta: { roles: FLOOR, title: 'Open a lot' },
      },
      {
        path: 'lots/:id(\\d+)',
        name: ROUTES.floorLot,
        component: () => import('@/views/floor/FloorLotView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: STAFF, title: 'Lot' },
      },
      {
        path: 'parts/:id(\\d+)',
        name: ROUTES.floorPart,
        component: () => import('@/views/floor/FloorPartView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: FLOOR, title: 'Inspect a part' },
      },
      {
        path: 'waiting',
        name: ROUTES.floorQueue,
        component: () => import('@/views/floor/FloorQueueView.vue'),
        meta: { roles: FLOOR, title: 'Waiting to send' },
      },
    ],
  },
  {
    path: '/review',
    meta: { roles: STAFF },
    children: [
      // The queue has its own path: the drawer marks an entry active on any path under it.
      { path: '', redirect: { name: ROUTES.reviewQueue } },
      {
        path: 'queue',
        name: ROUTES.reviewQueue,
        component: () => import('@/views/review/ReviewQueueView.vue'),
        meta: { roles: QA, title: 'Review queue' },
      },
      {
        path: 'lots/:id(\\d+)',
        name: ROUTES.reviewLot,
        component: () => import('@/views/review/ReviewLotView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: REVIEW_READERS, title: 'Lot review' },
      },
      {
        path: 'lots/:id(\\d+)/history',
        name: ROUTES.reviewLotHistory,
        component: () => import('@/views/review/ReviewLotHistoryView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: STAFF, title: 'Lot history' },
      },
      {
        path: 'nonconformances',
        name: ROUTES.reviewNcs,
        component: () => import('@/views/review/ReviewNcListView.vue'),
        meta: { roles: STAFF, title: 'Nonconformances' },
      },
      {
        path: 'nonconformances/:id(\\d+)',
        name: ROUTES.reviewNc,
        component: () => import('@/views/review/ReviewNcView.vue'),
        props: (r) => ({ id: Number(r.params.id) }),
        meta: { roles: STAFF, title: 'Nonconformance' },
      },
    ],
  },
  {
    path: '/line-health',
    name: ROUTES.trends,
    component: () => import('@/views/trends/TrendsView.vue'),
    meta: { roles: TRENDS_ROLES, title: 'Line health' },
  },
  {
    path: '/certificates',
    name: ROUTES.certificates,
    component: () => import('@/views/certificates/CertificatesView.vue'),
    meta: { roles: CERTIFICATE_STAFF, title: 'Certificates' },
  },
  {
    path: '/certificates/:id(\\d+)',
    name: ROUTES.certificate,
    component: () => import('@/views/certificates/CertificateDetailView.vue'),
    props: (r) => ({ id: Number(r.params.id) }),
    meta: { roles: CERTIFICATE_READERS, title: 'Certificate' },
  },
  {
    path: '/portal',
    name: ROUTES.portal,
    component: () => import('@/views/portal/PortalCertificatesView.vue'),
    meta: { roles: ['customer'], title: 'Your certificates' },
  },
  {
    // The QR code's target: open to anyone, no sign-in, no menu.
    path: '/verify/:code',
    name: ROUTES.verify,
    component: () => import('@/views/verify/VerifyView.vue'),
    props: (r) => ({ code: String(r.params.code) }),
    meta: { public: true, title: 'Certificate check' },
  },
  { path: '/:pathMatch(.*)*', redirect: { name: ROUTES.home } },
]

export const router = createRouter({ history: createWebHistory(), routes })

/**
 * The one guard. Public pages open for anyone (a signed-in person is sent home from sign-in);
 * every other page needs a session, and the role must be in meta.roles.
 */
router.beforeEach(async (to) => {
  const session = useSessionStore()
  await session.restore()
  if (to.meta.public) {
    return to.name === ROUTES.signIn && session.signedIn ? roleHome(session.user!.role) : true
  }
  if (!session.signedIn) {
    return { name: ROUTES.signIn, query: to.fullPath === '/' ? {} : { redirect: to.fullPath } }
  }
  const roles = to.meta.roles
  if (!roles || !roles.includes(session.user!.role)) return roleHome(session.user!.role)
  return true
})

router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Filmtrail` : 'Filmtrail'
})
