/**
 * What an administrator does to an account: deactivate it (it cannot sign in and every session it
 * has ends at once) and reactivate it. Sending a reset link is in `passwords.ts`.
 */
import type { AccountView } from '@shared/api';
import type { AppContext } from '../context';
import { findUserById, setDeactivatedAt, type User } from '../db/users';
import { revokeUserSessions } from '../db/sessions';
import { failure, success, type Outcome } from '../http/failure';
import { iso, userView } from './views';

/** A user as the administration page shows them. */
export function accountView(u: User): AccountView {
  return { ...userView(u), deactivatedAt: u.deactivatedAt ? iso(u.deactivatedAt) : null };
}

export async function deactivateAccount(ctx: AppContext, admin: User, userId: string): Promise<Outcome<User>> {
  if (userId === admin.id) return failure('conflict', 'You cannot deactivate your own account; another administrator can');
  const user = await findUserById(ctx.orm, userId);
  if (!user) return failure('not_found', 'This account does not exist');
  const now = ctx.clock.now();
  // Deactivated first: from this statement on, the session check refuses the account's tokens.
  const updated = user.deactivatedAt ? user : await setDeactivatedAt(ctx.orm, userId, now);
  if (!updated) return failure('not_found', 'This account does not exist');
  await revokeUserSessions(ctx.orm, userId, now);
  return success(updated);
}

export async function reactivateAccount(ctx: AppContext, userId: string): Promise<Outcome<User>> {
  const user = await findUserById(ctx.orm, userId);
  if (!user) return failure('not_found', 'This account does not exist');
  const updated = user.deactivatedAt ? await setDeactivatedAt(ctx.orm, userId, null) : user;
  return updated ? success(updated) : failure('not_found', 'This account does not exist');
}
