/**
 * The app's API client. A 401 on any signed-in call dispatches `SESSION_EXPIRED_EVENT` on
 * `window`; `App.vue` listens and sends the user to sign-in, and back afterwards. A GET first
 * claims a read sent at boot (`bootReads.ts`); any write drops the unclaimed ones.
 */
import { bootReads } from './bootReads';
import { createApi } from './client';
import { createHttp } from './http';

export const SESSION_EXPIRED_EVENT = 'rungwright:session-expired';

export const api = createApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
    fetchImpl: bootReads.fetch,
  }),
);
