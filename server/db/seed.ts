/**
 * Demo data for a first start on an empty DATA_DIR, all in the invented Larch Hollow Timber Co.
 * scenario and marked `demo`: an admin, an instructor, three students, a class with a join code,
 * and a few programs. Sign-ins are in `demoAccounts.ts`.
 */
import type { Clock } from '../clock';
import { DEFAULT_SCRYPT, hashPassword, type ScryptParams } from '../auth/passwords';
import type { Db } from './client';
import { DEMO_ADMIN, DEMO_CLASS, DEMO_INSTRUCTOR, DEMO_STUDENTS, type DemoAccount } from './demoAccounts';
import { REVERSING_DEMO, THREE_WIRE_DEMO } from './demoPrograms';
import { countUsers, insertUser, type User } from './users';
import { enrol, insertClass } from './classes';
import { appendVersion, insertProgram } from './programs';
import { seedDemoLabs } from './seedLabs';

/** Seeds the demo data when the database has no user yet; returns whether it did. */
export async function seedIfEmpty(db: Db, clock: Clock, params: ScryptParams = DEFAULT_SCRYPT): Promise<boolean> {
  if ((await countUsers(db)) > 0) return false;
  await seedDemoData(db, clock, params);
  return true;
}

/**
 * What a start does to a database without users: seed the demo (`DEMO=on`, the default), or leave
 * it empty for a real install whose first admin comes from `npm run cli -- create-admin`.
 */
export async function seedOnFirstStart(db: Db, clock: Clock, demo: 'on' | 'off', params: ScryptParams = DEFAULT_SCRYPT): Promise<'seeded' | 'no-accounts' | 'has-accounts'> {
  if (demo === 'on') return (await seedIfEmpty(db, clock, params)) ? 'seeded' : 'has-accounts';
  return (await countUsers(db)) > 0 ? 'has-accounts' : 'no-accounts';
}

export async function seedDemoData(db: Db, clock: Clock, params: ScryptParams = DEFAULT_SCRYPT): Promise<void> {
  const now = clock.now();
  const add = async (a: DemoAccount): Promise<User> => {
    const user = await insertUser(db, { email: a.email, name: a.name, role: a.role, passwordHash: await hashPassword(a.password, params), demo: true, createdAt: now });
    if (!user) throw new Error(`demo account ${a.email} exists already: the database is not empty`);
    return user;
  };
  await add(DEMO_ADMIN);
  const instructor = await add(DEMO_INSTRUCTOR);
  const students: User[] = [];
  for (const s of DEMO_STUDENTS) students.push(await add(s));

  const cls = await insertClass(db, { name: DEMO_CLASS.name, term: DEMO_CLASS.term, joinCode: DEMO_CLASS.joinCode, instructorId: instructor.id, demo: true, now });
  if (!cls) throw new Error('the demo join code is taken: the database is not empty');
  for (const s of students) await enrol(db, cls.id, s.id, now);

  const [ana, tom] = students;
  const first = await insertProgram(db, { ownerId: ana.id, authorId: ana.id, title: THREE_WIRE_DEMO.title, document: { ...THREE_WIRE_DEMO, rungs: [] }, message: 'Started (demo)', demo: true, now });
  await appendVersion(db, { programId: first.program.id, baseVersion: 1, document: THREE_WIRE_DEMO, message: 'Seal-in rung (demo)', authorId: ana.id, now });
  await insertProgram(db, { ownerId: ana.id, authorId: ana.id, title: REVERSING_DEMO.title, document: REVERSING_DEMO, message: 'Interlocked forward/reverse (demo)', demo: true, now });
  await insertProgram(db, { ownerId: tom.id, authorId: tom.id, title: THREE_WIRE_DEMO.title, document: THREE_WIRE_DEMO, message: 'First try (demo)', demo: true, now });
  await insertProgram(db, { ownerId: instructor.id, authorId: instructor.id, title: 'Reference: forward/reverse (demo)', document: REVERSING_DEMO, message: 'Instructor reference (demo)', demo: true, now });
  await seedDemoLabs(db, now, instructor, cls.id, students);
}
