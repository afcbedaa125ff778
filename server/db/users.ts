/** The users table as plain objects. Email lookups are case-insensitive (`lower(email)` index). */
import { count, eq, sql } from 'drizzle-orm';
import type { Db } from './client';
import { users, type User } from './schema';
import { readThrough, rowCachesOf } from './rowCache';

/** The service-side view of a user row lives beside the table (`schema.ts`), so the row cache can name it without importing this module. */
export type { User };

/** The columns of a `User`; exported so a join (the session check) can read a user in the same query. */
export const publicColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  role: users.role,
  demo: users.demo,
  createdAt: users.createdAt,
  lastSignInAt: users.lastSignInAt,
  deactivatedAt: users.deactivatedAt,
};

export interface NewUser {
  email: string;
  name: string;
  role: User['role'];
  passwordHash: string;
  demo?: boolean;
  createdAt: Date;
}

/** Inserts a user; returns null when the e-mail is taken (any case). */
export async function insertUser(db: Db, user: NewUser): Promise<User | null> {
  const rows = await db
    .insert(users)
    .values({ ...user, demo: user.demo ?? false })
    .onConflictDoNothing()
    .returning(publicColumns);
  return rows[0] ?? null;
}

/** Every signed-in request asks this, so it reads through the row cache (`rowCache.ts`). */
export async function findUserById(db: Db, id: string): Promise<User | null> {
  const load = async () => (await db.select(publicColumns).from(users).where(eq(users.id, id)).limit(1))[0] ?? null;
  return readThrough(db, 'users', id, load);
}

export async function findUserByEmail(db: Db, email: string): Promise<User | null> {
  const rows = await db.select(publicColumns).from(users).where(sql`lower(${users.email}) = lower(${email})`).limit(1);
  return rows[0] ?? null;
}

/** The user and their password hash, by e-mail (sign-in) or by id (a password change). */
export async function findCredentials(db: Db, by: { email: string } | { id: string }): Promise<{ user: User; passwordHash: string } | null> {
  const rows = await db
    .select({ ...publicColumns, passwordHash: users.passwordHash })
    .from(users)
    .where('email' in by ? sql`lower(${users.email}) = lower(${by.email})` : eq(users.id, by.id))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const { passwordHash, ...user } = row;
  return { user, passwordHash };
}

export async function setLastSignIn(db: Db, id: string, at: Date): Promise<void> {
  await db.update(users).set({ lastSignInAt: at }).where(eq(users.id, id));
  rowCachesOf(db)?.users.drop(id);
}

export async function setPasswordHash(db: Db, id: string, passwordHash: string): Promise<void> {
  await db.update(users).set({ passwordHash }).where(eq(users.id, id));
  rowCachesOf(db)?.users.drop(id);
}

/**
 * Deactivates (`at`) or reactivates (null) an account; the user as it now is, or null when there
 * is no such user. Ending its sessions is the caller's next step (`revokeUserSessions`); the session
 * check refuses a deactivated user's sessions by itself in the meantime.
 */
export async function setDeactivatedAt(db: Db, id: string, at: Date | null): Promise<User | null> {
  const rows = await db.update(users).set({ deactivatedAt: at }).where(eq(users.id, id)).returning(publicColumns);
  rowCachesOf(db)?.users.drop(id);
  return rows[0] ?? null;
}

/**
 * Takes the account's row lock until the transaction `tx` ends, so that changes to one account's
 * password, sessions and reset links made by several requests (or processes) happen one after
 * the other.
 */
export async function lockUser(tx: Db, id: string): Promise<boolean> {
  const rows = await tx.select({ id: users.id }).from(users).where(eq(users.id, id)).for('update');
  return rows.length === 1;
}

export async function countUsers(db: Db): Promise<number> {
  const [row] = await db.select({ n: count() }).from(users);
  return row?.n ?? 0;
}

export async function listUsers(db: Db): Promise<User[]> {
  return db.select(publicColumns).from(users).orderBy(users.email);
}

/** Gives an account another role; the user as it now is, or null when there is no such user. */
export async function setRole(db: Db, id: string, role: User['role']): Promise<User | null> {
  const rows = await db.update(users).set({ role }).where(eq(users.id, id)).returning(publicColumns);
  rowCachesOf(db)?.users.drop(id);
  return rows[0] ?? null;
}
