/** `GET /api/admin/status`: the demo accounts that can still sign in, for the admin page's warning. */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AdminStatusSchema } from '@shared/api/adminStatus';
import { seedDemoData } from '../../server/db/seed';
import { DEMO_ACCOUNTS, DEMO_ADMIN, DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { users } from '../../server/db/schema';
import { createTestApp, onPostgres, TEST_SCRYPT, type TestApp } from './helpers/testApp';
import { call, person, signIn, type Person } from './helpers/fixtures';

describe('GET /api/admin/status on a real install (no demo data)', () => {
  let t: TestApp;
  let admin: Person;
  beforeAll(async () => {
    t = await createTestApp();
    admin = await person(t, 'admin@college.example', 'admin');
  });
  afterAll(async () => {
    await t.close();
  });

  it('lists no demo account, and is never cached', async () => {
    const res = await call(t, 'get', '/api/admin/status', admin.cookie);
    expect(res.status).toBe(200);
    expect(AdminStatusSchema.parse(res.body)).toEqual({ demoAccounts: [], mailbox: 'local', backup: !onPostgres() });
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('answers only admins', async () => {
    expect((await call(t, 'get', '/api/admin/status')).status).toBe(401);
    for (const role of ['student', 'instructor'] as const) {
      const someone = await person(t, `${role}@college.example`, role);
      expect([role, (await call(t, 'get', '/api/admin/status', someone.cookie)).status]).toEqual([role, 403]);
    }
  });
});

describe('GET /api/admin/status with the demo data seeded', () => {
  let t: TestApp;
  let demoAdmin: string;
  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoData(t.database.orm, t.clock, TEST_SCRYPT);
    demoAdmin = await signIn(t, DEMO_ADMIN.email, DEMO_ADMIN.password);
  });
  afterAll(async () => {
    await t.close();
  });

  it('lists every demo account that can sign in, admins first', async () => {
    const res = await call(t, 'get', '/api/admin/status', demoAdmin);
    expect(res.status).toBe(200);
    const listed = AdminStatusSchema.parse(res.body).demoAccounts;
    expect(listed.map((a) => a.email)).toEqual([DEMO_ADMIN.email, DEMO_INSTRUCTOR.email, ...DEMO_STUDENTS.map((s) => s.email).sort()]);
    expect(listed[0]).toEqual({ email: DEMO_ADMIN.email, name: DEMO_ADMIN.name, role: 'admin' });
    expect(listed).toHaveLength(DEMO_ACCOUNTS.length);
  });

  it('leaves out a deactivated demo account, and lists no non-demo account', async () => {
    await t.database.orm.update(users).set({ deactivatedAt: t.clock.now() }).where(eq(users.email, DEMO_STUDENTS[0]!.email));
    await person(t, 'real.admin@college.example', 'admin');
    const listed = AdminStatusSchema.parse((await call(t, 'get', '/api/admin/status', demoAdmin)).body).demoAccounts.map((a) => a.email);
    expect(listed).not.toContain(DEMO_STUDENTS[0]!.email);
    expect(listed).not.toContain('real.admin@college.example');
    expect(listed).toHaveLength(DEMO_ACCOUNTS.length - 1);
  });
});
