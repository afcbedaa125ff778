/**
 * The typed calls of account management: a signed-in user changing their password or signing out
 * everywhere, and an administrator deactivating, reactivating or sending a reset link to an
 * account. Answers are parsed with the shared schemas (`shared/api/accounts.ts`).
 */
import { AccountResponseSchema, ResetLinkSentSchema, type ChangePasswordRequest } from '@shared/api/accounts';
import { SessionResponseSchema } from '@shared/api/auth';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';

const enc = encodeURIComponent;

export const ACCOUNT_ENDPOINTS = {
  changePassword: '/api/auth/password',
  signOutEverywhere: '/api/auth/sign-out-everywhere',
  deactivate: (userId: string) => `/api/admin/users/${enc(userId)}/deactivate`,
  reactivate: (userId: string) => `/api/admin/users/${enc(userId)}/reactivate`,
  sendResetLink: (userId: string) => `/api/admin/users/${enc(userId)}/password-reset`,
} as const;

export function createAccountsApi(http: Http) {
  return {
    /** Changes the password; every other session ends, this one goes on (the server re-issues its cookie). */
    changePassword: (body: ChangePasswordRequest) => http.json(ACCOUNT_ENDPOINTS.changePassword, SessionResponseSchema, { method: 'POST', body }).then((r) => r.user),
    /** Ends every session of the signed-in user, this one included. */
    signOutEverywhere: () => http.raw(ACCOUNT_ENDPOINTS.signOutEverywhere, { method: 'POST' }).then(() => undefined),
    deactivate: (userId: string) => http.json(ACCOUNT_ENDPOINTS.deactivate(userId), AccountResponseSchema, { method: 'POST' }).then((r) => r.user),
    reactivate: (userId: string) => http.json(ACCOUNT_ENDPOINTS.reactivate(userId), AccountResponseSchema, { method: 'POST' }).then((r) => r.user),
    sendResetLink: (userId: string) => http.json(ACCOUNT_ENDPOINTS.sendResetLink(userId), ResetLinkSentSchema, { method: 'POST' }).then((r) => r.sent),
  };
}

export type AccountsApi = ReturnType<typeof createAccountsApi>;

/** The app's account-management client. */
export const accountsApi = createAccountsApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);
