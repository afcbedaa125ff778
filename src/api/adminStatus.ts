/**
 * The typed call of `GET /api/admin/status` (admin only), parsed with its shared schema. Its
 * query key starts with the accounts list's key, so whatever refreshes the accounts (an account
 * deactivated or deleted) refreshes this status too.
 */
import { AdminStatusSchema, type AdminStatus } from '@shared/api/adminStatus';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';
import { queryKeys } from './queryKeys';

export const ADMIN_STATUS_ENDPOINT = '/api/admin/status';
export const adminStatusKey = [...queryKeys.users, 'admin-status'] as const;

export function createAdminStatusApi(http: Http) {
  return { get: (): Promise<AdminStatus> => http.json(ADMIN_STATUS_ENDPOINT, AdminStatusSchema) };
}

/** The app's admin-status client. */
export const adminStatusApi = createAdminStatusApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);
