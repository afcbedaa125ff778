/**
 * The app's vue-query client. Its default retries every failed read three times with a growing
 * wait, so a lab or class that does not exist (404) or is not open (403) showed a spinner for about
 * seven seconds before its message. An answer the server gave on purpose does not change on a
 * retry: only a lost connection or a server error (5xx) is tried again.
 */
import { QueryClient } from '@tanstack/vue-query';
import { ApiFailure } from './http';

const MAX_RETRIES = 2;

export function shouldRetry(failureCount: number, error: unknown): boolean {
  if (failureCount >= MAX_RETRIES) return false;
  if (!(error instanceof ApiFailure)) return true;
  return error.code === 'network' || error.status >= 500;
}

export function createAppQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: { queries: { retry: shouldRetry } } });
}
