import type { RouteRecordRaw } from 'vue-router'

/**
 * The lazy route table; every page is its own chunk. `meta.title` sets the document title.
 * Add one entry per page; the catch-all stays last.
 */
export const routes: RouteRecordRaw[] = [
  {
    path: '/',
    component: () => import('../layouts/MainLayout.vue'),
    children: [
      { path: '', name: 'home', component: () => import('../pages/HomePage.vue'), meta: { title: 'Home' } },
      {
        path: 'vehicles',
        name: 'vehicles',
        component: () => import('../pages/VehiclesPage.vue'),
        meta: { title: 'Vehicles' },
      },
      {
        path: 'scenarios',
        name: 'scenarios',
        component: () => import('../pages/ScenariosPage.vue'),
        meta: { title: 'Scenarios' },
      },
      {
        path: 'vehicles/:vehicleId',
        name: 'vehicles.detail',
        component: () => import('../pages/VehiclePage.vue'),
        meta: { requiresAuth: true, title: 'Vehicle' },
      },
      {
        path: 'vehicles/:vehicleId/scenarios/new',
        name: 'scenarios.new',
        component: () => import('../pages/ScenarioEditPage.vue'),
        meta: { requiresAuth: true, title: 'New scenario' },
      },
      {
        path: 'scenarios/:scenarioId',
        name: 'scenarios.edit',
        component: () => import('../pages/ScenarioEditPage.vue'),
        meta: { requiresAuth: true, title: 'Scenario' },
      },
      {
        path: 'vehicles/:vehicleId/build-sheet',
        name: 'vehicles.build-sheet',
        component: () => import('../pages/BuildSheetPage.vue'),
        meta: { requiresAuth: true, title: 'Build sheet' },
      },
      {
        path: 'scenarios/:scenarioId/outlook',
        name: 'outlook',
        component: () => import('../pages/ScenarioOutlookPage.vue'),
        meta: { requiresAuth: true, title: 'Outlook' },
      },
      {
        path: 'side-by-side',
        name: 'compare',
        component: () => import('../pages/ComparePage.vue'),
        meta: { requiresAuth: true, title: 'Side by side' },
      },
      {
        path: 'reviews',
        name: 'reviews',
        component: () => import('../pages/ReviewsPage.vue'),
        meta: { title: 'Reviews' },
      },
      {
        path: 'account',
        name: 'account',
        component: () => import('../pages/AccountPage.vue'),
        meta: { requiresAuth: true, title: 'Account' },
      },
      {
        path: 'sign-in',
        name: 'sign-in',
        component: () => import('../pages/SignInPage.vue'),
        meta: { title: 'Sign in' },
      },
      {
        path: 'sign-up',
        name: 'sign-up',
        component: () => import('../pages/SignUpPage.vue'),
        meta: { title: 'Create an account' },
      },
      {
        path: 'verify-email',
        name: 'verify-email',
        component: () => import('../pages/VerifyEmailPage.vue'),
        meta: { title: 'Confirm e-mail' },
      },
      {
        path: 'forgot-password',
        name: 'forgot-password',
        component: () => import('../pages/ForgotPasswordPage.vue'),
        meta: { title: 'Forgot password' },
      },
      {
        path: 'reset-password',
        name: 'reset-password',
        component: () => import('../pages/ResetPasswordPage.vue'),
        meta: { title: 'New password' },
      },
      {
        path: 'admin/users',
        name: 'admin-users',
        component: () => import('../pages/AdminUsersPage.vue'),
        meta: { requiresAuth: true, requiresRole: 'admin', title: 'People' },
      },
      {
        path: 'mailbox',
        name: 'mailbox',
        component: () => import('../pages/MailboxPage.vue'),
        meta: { title: 'Local mailbox' },
      },
      {
        path: 'vehicles/:vehicleId/logs',
        name: 'vehicles.logs',
        component: () => import('../pages/LogsPage.vue'),
        meta: { requiresAuth: true, title: 'Logs' },
      },
      {
        path: 'vehicles/:vehicleId/crew',
        name: 'crew',
        component: () => import('../pages/CrewPage.vue'),
        meta: { requiresAuth: true, title: 'Crew' },
      },
      {
        path: 'invitations/:token',
        name: 'invitation',
        component: () => import('../pages/InvitationPage.vue'),
        meta: { title: 'Invitation' },
      },
      {
        path: 'advisors',
        name: 'advisors',
        component: () => import('../pages/AdvisorsPage.vue'),
        meta: { requiresAuth: true, title: 'Advisors' },
      },
      {
        path: 'advisors/me',
        name: 'advisor-me',
        component: () => import('../pages/AdvisorProfilePage.vue'),
        meta: { requiresAuth: true, title: 'My advisor profile' },
      },
      {
        path: 'reviews/:reviewId',
        name: 'review',
        component: () => import('../pages/ReviewPage.vue'),
        meta: { requiresAuth: true, title: 'Review' },
      },
      {
        path: ':pathMatch(.*)*',
        name: 'not-found',
        component: () => import('../pages/NotFoundPage.vue'),
        meta: { title: 'Not found' },
      },
    ],
  },
]
