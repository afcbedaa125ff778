/**
 * The query cache holds one person's server data: their programs, classes, labs. On a shared lab
 * computer the next person to sign in must never see it, not even while their own loads, so the
 * cache is emptied the moment the signed-in user changes or signs out (synchronously, before any
 * page renders for the new user). Signing in from nobody keeps it: it was emptied on the way out.
 */
import { watch, type WatchSource, type WatchStopHandle } from 'vue';
import type { QueryClient } from '@tanstack/vue-query';

export function clearCacheOnUserChange(queryClient: QueryClient, userId: WatchSource<string | null>): WatchStopHandle {
  return watch(
    userId,
    (now, before) => {
      if (before !== null && now !== before) queryClient.clear();
    },
    { flush: 'sync' },
  );
}
