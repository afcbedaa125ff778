import { createRouter, createWebHistory, START_LOCATION, type RouteLocationNormalized } from 'vue-router';
import { bootReads } from '../api/bootReads';
import { useSessionStore } from '../stores/session';
import { decideAccess, type AccessMeta } from './guards';
import { routes } from './routes';

export const router = createRouter({ history: createWebHistory(), routes });

/**
 * Start fetching a lazy route's code while the session check is in flight: the router would only
 * load it after the guard, one round trip later. The module loader keeps the import, so the
 * router's own call reuses it.
 */
function preloadRouteCode(to: Pick<RouteLocationNormalized, 'matched'>): void {
  for (const record of to.matched) {
    for (const component of Object.values(record.components ?? {})) {
      if (typeof component === 'function') void (component as () => Promise<unknown>)()?.catch?.(() => undefined);
    }
  }
}

// The first page's code is asked for as soon as this module runs, before the app mounts: the
// first guard only runs once mounting is done.
preloadRouteCode(router.resolve(`${location.pathname}${location.search}${location.hash}`));

router.beforeEach(async (to) => {
  preloadRouteCode(to);
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

router.afterEach((to, from) => {
  // Reads sent at boot are for the first page only (see api/bootReads.ts).
  if (from !== START_LOCATION) bootReads.drop();
  const title = typeof to.meta.title === 'string' ? to.meta.title : '';
  document.title = title ? `${title} · Rungwright` : 'Rungwright';
});
