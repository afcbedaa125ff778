/** Read-only: the demo accounts that can still sign in (seeded with published passwords). */
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from './client';
import { users } from './schema';

export interface ActiveDemoUser {
  email: string;
  name: string;
  role: 'student' | 'instructor' | 'admin';
}

/** Demo accounts not deactivated: admins first, then instructors, then students, each by e-mail. */
export async function listActiveDemoUsers(db: Db): Promise<ActiveDemoUser[]> {
  const roleOrder = sql`case ${users.role} when 'admin' then 0 when 'instructor' then 1 else 2 end`;
  return db
    .select({ email: users.email, name: users.name, role: users.role })
    .from(users)
    .where(and(eq(users.demo, true), isNull(users.deactivatedAt)))
    .orderBy(roleOrder, asc(users.email));
}
