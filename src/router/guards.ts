/**
 * Who may open which route. `decideAccess` is pure (tested without a router): a route's `meta`
 * says whether it is public, only for signed-out visitors, or for some roles; the decision is to
 * go ahead or redirect, carrying the wanted address in `next` so sign-in can send the user back.
 */
import type { Role, UserView } from '@shared/api';

export interface AccessMeta {
  /** Open to anyone. */
  public?: boolean;
  /** Only for signed-out visitors (sign-in, join); signed-in users go to their landing page (`homeFor`). */
  guestOnly?: boolean;
  /** Only these roles; signed-in users of another role see their landing page instead. */
  roles?: readonly Role[];
}

export type AccessDecision = { allow: true } | { allow: false; redirect: { name: string; query?: Record<string, string> } };

export const HOME_ROUTE = 'programs';

/**
 * Where each role lands: a student on their programs, an instructor on the class overview (their
 * week starts with who has not submitted), an administrator on the admin console.
 */
export const HOME_BY_ROLE = { student: 'programs', instructor: 'overview', admin: 'admin' } as const satisfies Record<Role, string>;

/** The landing page's route name for a signed-in user. */
export const homeFor = (user: Pick<UserView, 'role'>): string => HOME_BY_ROLE[user.role] ?? HOME_ROUTE;

/** The landing page's path for a signed-in user (sign-in goes there when no `next` is asked for). */
export const homePathFor = (user: Pick<UserView, 'role'>): string => `/${homeFor(user)}`;

/** Where a user may go. `fullPath` is the address asked for. */
export function decideAccess(meta: AccessMeta, user: UserView | null, fullPath: string): AccessDecision {
  if (meta.guestOnly) return user ? { allow: false, redirect: { name: homeFor(user) } } : { allow: true };
  if (meta.public) return { allow: true };
  if (!user) return { allow: false, redirect: { name: 'sign-in', query: { next: fullPath } } };
  if (meta.roles && !meta.roles.includes(user.role)) return { allow: false, redirect: { name: homeFor(user) } };
  return { allow: true };
}

/** The address to return to after signing in: only paths inside this app (no `//host` tricks). */
export function safeNext(next: unknown): string | null {
  if (typeof next !== 'string') return null;
  if (!next.startsWith('/') || next.startsWith('//') || next.includes('\\')) return null;
  if (next.startsWith('/sign-in')) return null;
  return next;
}
