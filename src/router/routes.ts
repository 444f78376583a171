// The route table. Every route is named and lazy-loaded; params reach pages as props (`props: true`);
// `meta.roles` limits a route to those roles; `meta.nav` puts it in the drawer (filtered by the same roles).
// Pages added later (fleet, events, criteria, administration, outbox) only need an entry here to appear in the drawer.
import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '../api/auth';

export interface NavEntry {
  label: string;
  /** A Material Icons ligature name, e.g. 'space_dashboard'. */
  icon: string;
  /** Shown only while the server's local mail sink runs (the outbox). */
  requiresMailSink?: boolean;
}

declare module 'vue-router' {
  interface RouteMeta {
    /** Reachable without signing in. */
    public?: boolean;
    /** Only users holding at least one of these roles (absent = any signed-in user). */
    roles?: Role[];
    /** An entry in the shell's navigation drawer. */
    nav?: NavEntry;
    /** The browser tab's title, before " · Gapsight". */
    title?: string;
  }
}

export const routes: RouteRecordRaw[] = [
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('../pages/SignInPage.vue'),
    meta: { public: true, title: 'Sign in' },
  },
  {
    // The shell (header, drawer, footer) around every signed-in page. Only its children are named:
    // a named parent with an empty-path child makes `{ name: parent }` render no page.
    path: '/',
    component: () => import('../layouts/AppShellLayout.vue'),
    children: [
      {
        path: '',
        name: 'desk',
        component: () => import('../pages/DeskPage.vue'),
        meta: { title: 'Desk', nav: { label: 'Desk', icon: 'space_dashboard' } },
      },
      {
        path: 'units',
        name: 'units',
        component: () => import('../pages/UnitListPage.vue'),
        meta: { title: 'Fleet', nav: { label: 'Fleet', icon: 'electrical_services' } },
      },
      {
        path: 'units/:id(\\d+)',
        name: 'unit-file',
        component: () => import('../pages/UnitFilePage.vue'),
        props: true,
        meta: { title: 'Unit file' },
      },
      {
        path: 'designs/:id(\\d+)',
        name: 'design-family',
        component: () => import('../pages/DesignFamilyPage.vue'),
        props: true,
        meta: { title: 'Design family' },
      },
      {
        path: 'events',
        name: 'events',
        component: () => import('../pages/EventListPage.vue'),
        meta: { title: 'Events', nav: { label: 'Events', icon: 'view_list' } },
      },
      {
        path: 'events/new',
        name: 'event-new',
        component: () => import('../pages/EventNewPage.vue'),
        meta: { title: 'Log a fault', roles: ['protection', 'admin'], nav: { label: 'Log a fault', icon: 'flash_on' } },
      },
      {
        path: 'events/:id(\\d+)',
        name: 'event-file',
        component: () => import('../pages/EventFilePage.vue'),
        props: true,
        meta: { title: 'Event file' },
      },
      {
        path: 'criteria',
        name: 'criteria',
        component: () => import('../pages/CriteriaPage.vue'),
        meta: { title: 'Criteria sets', nav: { label: 'Criteria sets', icon: 'rule' } },
      },
      {
        // Administration (admin): people, sites, design families and units, one tab each.
        path: 'admin',
        name: 'admin',
        component: () => import('../pages/admin/AdminPage.vue'),
        redirect: { name: 'admin-people' },
        meta: { title: 'Administration', roles: ['admin'], nav: { label: 'Administration', icon: 'admin_panel_settings' } },
        children: [
          { path: 'people', name: 'admin-people', component: () => import('../pages/admin/AdminPeoplePage.vue'), meta: { title: 'People · Administration' } },
          { path: 'sites', name: 'admin-sites', component: () => import('../pages/admin/AdminSitesPage.vue'), meta: { title: 'Sites · Administration' } },
          { path: 'designs', name: 'admin-designs', component: () => import('../pages/admin/AdminDesignsPage.vue'), meta: { title: 'Design families · Administration' } },
          { path: 'units', name: 'admin-units', component: () => import('../pages/admin/AdminUnitsPage.vue'), meta: { title: 'Units · Administration' } },
        ],
      },
      {
        path: 'dev/outbox',
        name: 'outbox',
        component: () => import('../pages/OutboxPage.vue'),
        meta: { title: 'Outbox', roles: ['admin', 'manager'], nav: { label: 'Outbox', icon: 'outbox', requiresMailSink: true } },
      },
      {
        // Choosing a new password: forced after signing in with a one-time password, open to everyone signed in.
        path: 'password',
        name: 'password',
        component: () => import('../pages/PasswordPage.vue'),
        meta: { title: 'Choose your password' },
      },
      {
        path: 'forbidden',
        name: 'forbidden',
        component: () => import('../pages/ForbiddenPage.vue'),
        meta: { title: 'Not allowed' },
      },
      {
        // Catch-all: must stay the last route of the table.
        path: ':pathMatch(.*)*',
        name: 'not-found',
        component: () => import('../pages/NotFoundPage.vue'),
        props: true,
        meta: { title: 'Not found' },
      },
    ],
  },
];
