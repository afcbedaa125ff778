/**
 * Demo data for a first start on an empty DATA_DIR, all in the invented Larch Hollow Timber Co.
 * scenario and marked `demo`. Sign-ins are in `demoAccounts.ts`.
 */
import type { Clock } from '../clock';
import { DEFAULT_SCRYPT, hashPassword, type ScryptParams } from '../auth/passwords';
import type { Db } from './client';
import { DEMO_ACCOUNTS } from './demoAccounts';
import { countUsers, insertUser } from './users';

/** Seeds the demo data when the database has no user yet; returns whether it did. */
export async function seedIfEmpty(db: Db, clock: Clock, params: ScryptParams = DEFAULT_SCRYPT): Promise<boolean> {
  if ((await countUsers(db)) > 0) return false;
  await seedDemoData(db, clock, params);
  return true;
}

/** Inserts the demo accounts (and, in later steps, the demo class and programs). */
export async function seedDemoData(db: Db, clock: Clock, params: ScryptParams = DEFAULT_SCRYPT): Promise<void> {
  const now = clock.now();
  for (const account of DEMO_ACCOUNTS) {
    await insertUser(db, {
      email: account.email,
      name: account.name,
      role: account.role,
      passwordHash: await hashPassword(account.password, params),
      demo: true,
      createdAt: now,
    });
  }
}
