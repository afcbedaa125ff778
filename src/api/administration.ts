/**
 * The typed calls of the admin console beyond the account list (`authAccounts.ts`): role changes,
 * usage, invitations, the mailbox and the backup's address. Parsed with `shared/api/administration.ts`.
 */
import { z } from 'zod';
import { AccountResponseSchema } from '@shared/api/accounts';
import { InvitationEntryListSchema, InvitationEntryResponseSchema, UsageSchema } from '@shared/api/administration';
import type { Role } from '@shared/api/auth';
import { SentMailListSchema } from '@shared/api/mail';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';
import { queryKeys } from './queryKeys';

const enc = encodeURIComponent;

export const ADMIN_ENDPOINTS = {
  role: (userId: string) => `/api/admin/users/${enc(userId)}/role`,
  usage: '/api/admin/usage',
  invitations: '/api/admin/invitations',
  resend: (id: string) => `/api/invitations/${enc(id)}/resend`,
  cancel: (id: string) => `/api/invitations/${enc(id)}/cancel`,
  mail: (q: string) => (q.trim() ? `/api/dev/mail?q=${enc(q.trim())}` : '/api/dev/mail'),
  /** A plain link: the browser downloads the file itself. */
  backup: '/api/admin/backup',
} as const;

const Resent = z.object({ invitation: z.object({ email: z.string(), expiresAt: z.string() }) });

export function createAdministrationApi(http: Http) {
  return {
    changeRole: (userId: string, role: Role) => http.json(ADMIN_ENDPOINTS.role(userId), AccountResponseSchema, { method: 'POST', body: { role } }).then((r) => r.user),
    usage: () => http.json(ADMIN_ENDPOINTS.usage, UsageSchema),
    invitations: () => http.json(ADMIN_ENDPOINTS.invitations, InvitationEntryListSchema).then((r) => r.invitations),
    resend: (id: string) => http.json(ADMIN_ENDPOINTS.resend(id), Resent, { method: 'POST', body: {} }).then((r) => r.invitation),
    cancel: (id: string) => http.json(ADMIN_ENDPOINTS.cancel(id), InvitationEntryResponseSchema, { method: 'POST', body: {} }).then((r) => r.invitation),
    mail: (q: string) => http.json(ADMIN_ENDPOINTS.mail(q), SentMailListSchema).then((r) => r.mail),
  };
}

export const administrationApi = createAdministrationApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);

/** Under the accounts list's key, so whatever refreshes the accounts refreshes these too. */
export const adminKeys = {
  usage: [...queryKeys.users, 'usage'] as const,
  invitations: [...queryKeys.users, 'invitations'] as const,
  mail: (q: string) => [...queryKeys.users, 'mail', q] as const,
};
