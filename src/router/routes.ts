/**
 * The route table, apart from `createRouter` so node-environment tests can import it
 * (createWebHistory needs `location`). Every view is lazy-loaded: the canvas libraries are only
 * fetched on the workbench.
 */
import type { RouteRecordRaw } from 'vue-router';

export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: '/sign-in' },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('../views/SignInView.vue'),
    meta: { public: true, title: 'Sign in' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('../views/NotFoundView.vue'),
    meta: { public: true, title: 'Page not found' },
  },
];
