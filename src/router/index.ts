import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router';
import type { Role } from '../../shared/schemas/auth';
import { roleGuard } from './roleGuard';
import { shopRoutes } from './shopRoutes';
import { loadShopStudio } from '../components/shop/shopStudio';
import { useSessionStore } from '../stores/session';

declare module 'vue-router' {
  interface RouteMeta {
    /** Roles allowed to open the route (any one is enough); absent = any signed-in person. */
    roles?: Role[];
    /** Open without signing in (the sign-in page, the shop). */
    public?: true;
    /** A page of the public shop: plain Vue in its own frame, no session look-up, no Naive UI. */
    shop?: true;
    /** Page title, shown in the browser tab as "<title> · Nestwright". */
    title?: string;
  }
}

/** Every route of the client. Screens add their records here and their area to ./areas.ts. */
export const routes: RouteRecordRaw[] = [
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('../views/SignInView.vue'),
    meta: { public: true, title: 'Sign in' },
  },
  { path: '/', name: 'home', component: () => import('../views/HomeView.vue'), meta: { title: 'Home' } },
  {
    path: '/admin/people',
    name: 'admin-people',
    component: () => import('../views/AdminPeopleView.vue'),
    meta: { roles: ['admin'], title: 'People' },
  },
  {
    path: '/account/password',
    name: 'account-password',
    component: () => import('../views/ChangePasswordView.vue'),
    meta: { title: 'Change password' },
  },
  {
    path: '/designs',
    name: 'designs',
    component: () => import('../views/DesignsView.vue'),
    meta: { roles: ['designer'], title: 'Designs' },
  },
  {
    path: '/designs/new/:templateId',
    name: 'design-new',
    component: () => import('../views/DesignEditorView.vue'),
    meta: { roles: ['designer'], title: 'New design' },
  },
  {
    path: '/designs/:presetId',
    name: 'design-edit',
    component: () => import('../views/DesignEditorView.vue'),
    meta: { roles: ['designer'], title: 'Design' },
  },
  {
    path: '/check-file',
    name: 'check-file',
    component: () => import('../views/MeshAnalysisView.vue'),
    meta: { roles: ['designer'], title: 'Check a file' },
  },
  {
    path: '/families',
    name: 'families',
    component: () => import('../views/FamiliesView.vue'),
    meta: { roles: ['designer'], title: 'Families' },
  },
  {
    path: '/families/new',
    name: 'family-new',
    component: () => import('../views/FamilyEditorView.vue'),
    meta: { roles: ['designer'], title: 'New family' },
  },
  {
    // E-mails link here for everyone: a catalogue manager who is not a designer gets the review page instead.
    path: '/families/:id',
    name: 'family',
    component: () => import('../views/FamilyDetailView.vue'),
    meta: { roles: ['designer', 'catalogue_manager'], title: 'Family' },
    beforeEnter: (to) =>
      useSessionStore().hasRole('designer') ? true : { name: 'family-review', params: to.params, replace: true },
  },
  {
    path: '/families/:id/edit',
    name: 'family-edit',
    component: () => import('../views/FamilyEditorView.vue'),
    meta: { roles: ['designer'], title: 'Edit family' },
  },
  {
    path: '/review',
    name: 'review',
    component: () => import('../views/ReviewQueueView.vue'),
    meta: { roles: ['catalogue_manager'], title: 'Review' },
  },
  {
    path: '/review/:id',
    name: 'family-review',
    component: () => import('../views/FamilyReviewView.vue'),
    meta: { roles: ['catalogue_manager'], title: 'Review family' },
  },
  {
    path: '/catalogue',
    name: 'catalogue',
    component: () => import('../views/CatalogueView.vue'),
    meta: { roles: ['sales', 'catalogue_manager', 'designer'], title: 'Catalogue' },
  },
  {
    path: '/quotes',
    name: 'quotes',
    component: () => import('../views/QuotesView.vue'),
    meta: { roles: ['sales', 'catalogue_manager'], title: 'Quotes' },
  },
  {
    path: '/quotes/new',
    name: 'quote-new',
    component: () => import('../views/QuoteEditorView.vue'),
    meta: { roles: ['sales', 'catalogue_manager'], title: 'New quote' },
  },
  {
    path: '/quotes/:id/edit',
    name: 'quote-edit',
    component: () => import('../views/QuoteEditorView.vue'),
    meta: { roles: ['sales', 'catalogue_manager'], title: 'Edit quote' },
  },
  {
    path: '/quotes/:id',
    name: 'quote-detail',
    component: () => import('../views/QuoteDetailView.vue'),
    meta: { roles: ['sales', 'catalogue_manager'], title: 'Quote' },
  },
  {
    path: '/demand',
    name: 'demand',
    component: () => import('../views/DemandView.vue'),
    meta: { roles: ['operations', 'catalogue_manager', 'admin'], title: 'Demand' },
  },
  {
    path: '/runs/plan',
    name: 'run-planner',
    component: () => import('../views/RunPlannerView.vue'),
    meta: { roles: ['operations', 'catalogue_manager', 'admin'], title: 'Run planner' },
  },
  {
    path: '/farm/exceptions',
    name: 'farm-exceptions',
    component: () => import('../views/FarmExceptionsView.vue'),
    meta: { roles: ['operations', 'admin'], title: 'Farm exceptions' },
  },
  {
    path: '/admin/settings',
    name: 'admin-settings',
    component: () => import('../views/AdminSettingsView.vue'),
    meta: { roles: ['admin'], title: 'Studio settings' },
  },
  {
    path: '/admin/jobs',
    name: 'admin-jobs',
    component: () => import('../views/AdminJobsView.vue'),
    meta: { roles: ['admin'], title: 'Failed jobs' },
  },
  {
    path: '/admin/mail',
    name: 'admin-mail',
    component: () => import('../views/AdminMailView.vue'),
    meta: { roles: ['admin'], title: 'Captured e-mail' },
  },
  {
    path: '/orders',
    name: 'orders',
    component: () => import('../views/OrdersView.vue'),
    meta: { roles: ['operations', 'admin'], title: 'Orders' },
  },
  {
    path: '/orders/:id',
    name: 'order',
    component: () => import('../views/OrderDetailView.vue'),
    meta: { roles: ['operations', 'admin'], title: 'Order' },
  },
  ...shopRoutes,
  {
    path: '/forbidden',
    name: 'forbidden',
    component: () => import('../views/ForbiddenView.vue'),
    meta: { title: 'Not for your role' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('../views/NotFoundView.vue'),
    meta: { title: 'Not found' },
  },
];

/** The app's router with the sign-in and role guard installed. */
export const router = createRouter({
  history: createWebHistory(),
  routes,
  scrollBehavior: (_to, _from, saved) => saved ?? { top: 0 },
});

router.beforeEach(roleGuard);
// The shop writes prices in the studio's locale: learn it before the first shop screen (the answer is kept).
router.beforeEach(async (to) => {
  if (to.meta.shop) await loadShopStudio();
});
router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Nestwright` : 'Nestwright';
});
