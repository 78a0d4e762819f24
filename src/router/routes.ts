// Every route of the client, named and typed (STYLE habit 14): lazy pages, one layout route with
// children, the catch-all 404 last. `meta.roles` says who may open a page (CONTRACT section 6).
import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '../api/types';

/** Names of all routes; `routerPush` accepts only these. */
export type RouteName =
  | 'sign-in'
  | 'home'
  | 'designs'
  | 'design-workspace'
  | 'revision-history'
  | 'revision'
  | 'revision-compare'
  | 'release'
  | 'review-queue'
  | 'releases'
  | 'tokens'
  | 'admin-users'
  | 'admin-audit'
  | 'admin-mail'
  | 'not-found';

/** Route parameters per route name (routes not listed take none). */
export interface RouteParamsByName {
  'design-workspace': { id: string };
  'revision-history': { id: string };
  revision: { id: string };
  'revision-compare': { a: string; b: string };
  release: { id: string };
  'not-found': { pathMatch: string[] };
}

declare module 'vue-router' {
  interface RouteMeta {
    /** Roles that may open the page; absent = public. */
    roles?: readonly Role[];
    /** Navigation label; absent = not in the navigation. */
    navLabel?: string;
    /** Material icon of the navigation entry. */
    navIcon?: string;
    /** Document title. */
    title?: string;
    /** The page shows the safety caution in a footer the layout keeps clear of the content. */
    safetyFooter?: boolean;
  }
}

const everyone: readonly Role[] = ['engineer', 'reviewer', 'tester', 'admin'];
const notTester: readonly Role[] = ['engineer', 'reviewer', 'admin'];

/** The route table. */
export const routes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('../pages/SignInPage.vue'), meta: { title: 'Sign in' } },
  {
    path: '/',
    component: () => import('../layouts/WorkbenchLayout.vue'),
    meta: { roles: everyone },
    children: [
      // Never rendered: the guard sends a signed-in user to their role's start page, others to sign-in.
      { path: '', name: 'home', component: () => import('../pages/NotFoundPage.vue'), meta: { roles: everyone } },
      { path: 'designs', name: 'designs', component: () => import('../pages/DesignsPage.vue'), meta: { roles: notTester, navLabel: 'Designs', navIcon: 'precision_manufacturing', title: 'Designs' } },
      { path: 'designs/:id', name: 'design-workspace', component: () => import('../pages/DesignWorkspacePage.vue'), meta: { roles: ['engineer'], title: 'Design editor', safetyFooter: true } },
      { path: 'designs/:id/revisions', name: 'revision-history', component: () => import('../pages/RevisionHistoryPage.vue'), meta: { roles: notTester, title: 'Revisions' } },
      { path: 'revisions/:id', name: 'revision', component: () => import('../pages/RevisionPage.vue'), meta: { roles: notTester, title: 'Revision', safetyFooter: true } },
      { path: 'revisions/:a/compare/:b', name: 'revision-compare', component: () => import('../pages/RevisionComparePage.vue'), meta: { roles: notTester, title: 'Compare revisions' } },
      { path: 'reviews', name: 'review-queue', component: () => import('../pages/ReviewQueuePage.vue'), meta: { roles: ['reviewer'], navLabel: 'Review queue', navIcon: 'fact_check', title: 'Review queue' } },
      { path: 'releases', name: 'releases', component: () => import('../pages/ReleasesPage.vue'), meta: { roles: everyone, navLabel: 'Released sets', navIcon: 'inventory_2', title: 'Released sets' } },
      { path: 'releases/:id', name: 'release', component: () => import('../pages/ReleasePage.vue'), meta: { roles: everyone, title: 'Released set', safetyFooter: true } },
      { path: 'tokens', name: 'tokens', component: () => import('../pages/TokensPage.vue'), meta: { roles: ['tester', 'admin'], navLabel: 'Bench tokens', navIcon: 'key', title: 'Bench tokens' } },
      { path: 'admin/users', name: 'admin-users', component: () => import('../pages/AdminUsersPage.vue'), meta: { roles: ['admin'], navLabel: 'Accounts', navIcon: 'manage_accounts', title: 'Accounts' } },
      { path: 'admin/audit', name: 'admin-audit', component: () => import('../pages/AdminAuditPage.vue'), meta: { roles: ['admin'], navLabel: 'Audit trail', navIcon: 'history_edu', title: 'Audit trail' } },
      { path: 'admin/mail', name: 'admin-mail', component: () => import('../pages/AdminMailPage.vue'), meta: { roles: ['admin'], navLabel: 'Mail outbox', navIcon: 'outgoing_mail', title: 'Mail outbox' } },
    ],
  },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('../pages/NotFoundPage.vue'), meta: { title: 'Not found' } },
];

/** First page of a role after sign-in (testers cannot list designs). */
export function homeRouteFor(role: Role): RouteName {
  if (role === 'tester') return 'releases';
  if (role === 'reviewer') return 'review-queue';
  return 'designs';
}
