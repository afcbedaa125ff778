/**
 * After signing out: a full load of the sign-in page, not a route change. Everything the app held
 * for the person who left (every store, the query cache, an answer still on its way) goes with the
 * old page, so the next person at a shared computer starts from nothing.
 */
import type { Router } from 'vue-router';

export function leaveForSignIn(router: Router): void {
  window.location.replace(router.resolve({ name: 'sign-in' }).href);
}
