/**
 * The route table, apart from `createRouter` so node-environment tests can import it
 * (createWebHistory needs `location`). Every view is lazy-loaded: the canvas libraries are only
 * fetched on the workbench. `meta` feeds the access guard (`guards.ts`).
 */
import type { RouteRecordRaw } from 'vue-router';

export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: '/sign-in' },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('../views/SignInView.vue'),
    meta: { public: true, guestOnly: true, title: 'Sign in' },
  },
  {
    path: '/join',
    name: 'join',
    component: () => import('../views/JoinClassView.vue'),
    meta: { public: true, guestOnly: true, title: 'Join a class' },
  },
  {
    path: '/join/finish',
    name: 'join-finish',
    component: () => import('../views/JoinFinishView.vue'),
    meta: { public: true, title: 'Finish creating your account' },
  },
  {
    path: '/reset-password',
    name: 'reset-password',
    component: () => import('../views/ResetPasswordView.vue'),
    meta: { public: true, title: 'Reset password' },
  },
  {
    path: '/accept-invitation',
    name: 'accept-invitation',
    component: () => import('../views/AcceptInvitationView.vue'),
    meta: { public: true, title: 'Accept invitation' },
  },
  {
    path: '/programs',
    name: 'programs',
    component: () => import('../views/ProgramsView.vue'),
    meta: { title: 'My programs' },
  },
  {
    path: '/programs/:id',
    name: 'workbench',
    component: () => import('../views/WorkbenchView.vue'),
    props: true,
    meta: { title: 'Workbench' },
  },
  {
    path: '/classes',
    name: 'classes',
    component: () => import('../views/ClassesView.vue'),
    meta: { title: 'Classes' },
  },
  {
    path: '/classes/:classId/labs',
    name: 'class-labs',
    component: () => import('../views/LabListView.vue'),
    props: true,
    meta: { title: 'Labs' },
  },
  {
    path: '/classes/:classId/gradebook',
    name: 'gradebook',
    component: () => import('../views/GradebookView.vue'),
    props: true,
    meta: { roles: ['instructor', 'admin'], title: 'Gradebook' },
  },
  {
    path: '/classes/:classId/students',
    name: 'class-students',
    component: () => import('../views/ClassRosterView.vue'),
    props: true,
    meta: { roles: ['instructor', 'admin'], title: 'Students' },
  },
  {
    path: '/labs/:labId',
    name: 'lab',
    component: () => import('../views/LabStudentView.vue'),
    props: true,
    meta: { title: 'Lab' },
  },
  {
    path: '/labs/:labId/edit',
    name: 'lab-edit',
    component: () => import('../views/LabAuthorView.vue'),
    props: true,
    meta: { roles: ['instructor', 'admin'], title: 'Edit lab' },
  },
  {
    path: '/labs/:labId/submissions',
    name: 'lab-submissions',
    component: () => import('../views/SubmissionListView.vue'),
    props: true,
    meta: { roles: ['instructor', 'admin'], title: 'Submissions' },
  },
  {
    path: '/submissions/:submissionId',
    name: 'submission',
    component: () => import('../views/SubmissionReviewView.vue'),
    props: true,
    meta: { roles: ['instructor', 'admin'], title: 'Submission' },
  },
  {
    path: '/account',
    name: 'account',
    component: () => import('../views/AccountView.vue'),
    meta: { title: 'Your account' },
  },
  {
    path: '/admin',
    name: 'admin',
    component: () => import('../views/AdminView.vue'),
    meta: { roles: ['admin'], title: 'Administration' },
  },
  {
    path: '/simulator/:id?',
    name: 'simulator',
    component: () => import('../views/SimulatorView.vue'),
    props: true,
    meta: { public: true, title: 'Simulator' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('../views/NotFoundView.vue'),
    meta: { public: true, title: 'Page not found' },
  },
];
