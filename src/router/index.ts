import { createRouter, createWebHistory } from 'vue-router';
import { useSessionStore } from '../stores/session';
import { decideAccess, type AccessMeta } from './guards';
import { routes } from './routes';

export const router = createRouter({ history: createWebHistory(), routes });

router.beforeEach(async (to) => {
  const session = useSessionStore();
  let user = session.user;
  try {
    user = await session.ensure();
  } catch {
    // The server could not be reached: public pages still open; the others say so themselves.
  }
  const decision = decideAccess(to.meta as AccessMeta, user, to.fullPath);
  return decision.allow ? true : decision.redirect;
});

router.afterEach((to) => {
  const title = typeof to.meta.title === 'string' ? to.meta.title : '';
  document.title = title ? `${title} · Rungwright` : 'Rungwright';
});
