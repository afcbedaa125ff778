/**
 * The admin console through the API: role changes, usage counts, the database backup (restored
 * into a fresh PGlite to prove it is whole), invitations listed, sent again and cancelled, and the
 * local mailbox searched.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PGlite } from '@electric-sql/pglite';
import { InvitationEntryListSchema, UsageSchema } from '@shared/api/administration';
import { createTestApp, onPostgres, type TestApp } from './helpers/testApp';
import { call, createCast, type Cast } from './helpers/fixtures';
import { tokenIn, waitForMail } from './helpers/mailbox';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';
import { THREE_WIRE } from '@shared/labs';

let t: TestApp;
let cast: Cast;

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  const { labId } = await labFromTemplate(t, cast.instructor, cast.classId, THREE_WIRE.id);
  await publish(t, cast.instructor, labId);
  expect((await submitVersion(t, cast.studentA, labId, await saveInCopy(t, cast.studentA, labId, THREE_WIRE.solution))).status).toBe(201);
}, 60_000);
afterAll(() => t.close());

/** Reads the binary body of a download. */
const binary = (res: { on: (e: string, f: (c?: Buffer) => void) => void; setEncoding?: unknown }, done: (e: Error | null, b: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c) => chunks.push(c!));
  res.on('end', () => done(null, Buffer.concat(chunks)));
};

describe('role changes', () => {
  it('makes a student an instructor at once, refuses the admin’s own role and a teacher made student, and names a bad role', async () => {
    const res = await call(t, 'post', `/api/admin/users/${cast.studentB.user.id}/role`, cast.admin.cookie).send({ role: 'instructor' });
    expect(res.status, res.text).toBe(200);
    expect(res.body.user).toMatchObject({ id: cast.studentB.user.id, role: 'instructor' });
    // The next request of that account already acts with the new role.
    expect((await call(t, 'get', '/api/me', cast.studentB.cookie)).body.user.role).toBe('instructor');
    await call(t, 'post', `/api/admin/users/${cast.studentB.user.id}/role`, cast.admin.cookie).send({ role: 'student' });
    expect((await call(t, 'post', `/api/admin/users/${cast.admin.user.id}/role`, cast.admin.cookie).send({ role: 'student' })).status).toBe(409);
    const teacher = await call(t, 'post', `/api/admin/users/${cast.instructor.user.id}/role`, cast.admin.cookie).send({ role: 'student' });
    expect(teacher.status).toBe(409);
    expect(teacher.body.error.message).toMatch(/teaches a class/);
    const bad = await call(t, 'post', `/api/admin/users/${cast.studentA.user.id}/role`, cast.admin.cookie).send({ role: 'owner' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('role');
    expect((await call(t, 'post', `/api/admin/users/${cast.studentA.user.id}/role`, cast.instructor.cookie).send({ role: 'admin' })).status).toBe(403);
  });
});

describe('usage', () => {
  it('counts active students this week and submissions per day, 14 days ending today', async () => {
    const res = await call(t, 'get', '/api/admin/usage', cast.admin.cookie);
    expect(res.status).toBe(200);
    const usage = UsageSchema.parse(res.body);
    expect(usage.activeStudentsThisWeek).toBe(2);
    expect(usage.students).toBe(2);
    expect(usage.submissionsPerDay).toHaveLength(14);
    expect(usage.submissionsPerDay.at(-1)).toEqual({ day: t.clock.now().toISOString().slice(0, 10), count: 1 });
    expect(usage.submissionsPerDay.slice(0, -1).every((d) => d.count === 0)).toBe(true);
  });
});

describe('backup', () => {
  it.runIf(onPostgres())('sends no dump on a PostgreSQL server, and says to back it up there', async () => {
    const res = await call(t, 'get', '/api/admin/backup', cast.admin.cookie);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/pg_dump/);
  });

  it.skipIf(onPostgres())('downloads a gzipped dump of the database that a fresh PGlite opens with every account in it', async () => {
    const res = await call(t, 'get', '/api/admin/backup', cast.admin.cookie).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/gzip');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?rungwright-backup-\d{4}-\d\d-\d\dT\d{4}Z\.tar\.gz"?$/);
    // Restored exactly as docs/backup.md says: unpacked with tar into DATA_DIR/pgdata, then opened.
    expect(gunzipSync(res.body as Buffer).length).toBeGreaterThan(1_000_000);
    const dataDir = mkdtempSync(path.join(tmpdir(), 'rw-restore-'));
    const file = path.join(dataDir, 'backup.tar.gz');
    writeFileSync(file, res.body as Buffer);
    mkdirSync(path.join(dataDir, 'pgdata'));
    execFileSync('tar', ['-xzf', file, '-C', path.join(dataDir, 'pgdata')], { stdio: 'pipe' });
    const restored = await PGlite.create({ dataDir: path.join(dataDir, 'pgdata') });
    try {
      const rows = await restored.query<{ n: number }>('select count(*)::int as n from users');
      expect(rows.rows[0]!.n).toBe(5);
    } finally {
      await restored.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
    expect((await call(t, 'get', '/api/admin/backup', cast.instructor.cookie)).status).toBe(403);
  }, 60_000);
});

describe('invitations', () => {
  it('lists every invitation with its state, sends one again (the old link stops) and cancels one (its link stops)', async () => {
    expect((await call(t, 'post', '/api/admin/instructor-invitations', cast.admin.cookie).send({ email: 'new.teacher@test.example', name: 'New Teacher' })).status).toBe(201);
    const first = tokenIn(await waitForMail(t, cast.admin.cookie, 'new.teacher@test.example'));
    const list = InvitationEntryListSchema.parse((await call(t, 'get', '/api/admin/invitations', cast.admin.cookie)).body).invitations;
    const entry = list.find((i) => i.email === 'new.teacher@test.example')!;
    expect(entry).toMatchObject({ role: 'instructor', classId: null, state: 'open' });

    const again = await call(t, 'post', `/api/invitations/${entry.id}/resend`, cast.admin.cookie).send({});
    expect(again.status, again.text).toBe(201);
    expect((await call(t, 'post', '/api/auth/invitations/lookup').send({ token: first })).status).toBe(400);
    const newest = InvitationEntryListSchema.parse((await call(t, 'get', '/api/admin/invitations', cast.admin.cookie)).body).invitations.find((i) => i.email === 'new.teacher@test.example' && i.state === 'open')!;
    const cancelled = await call(t, 'post', `/api/invitations/${newest.id}/cancel`, cast.admin.cookie).send({});
    expect(cancelled.status, cancelled.text).toBe(200);
    expect(cancelled.body.invitation.state).toBe('cancelled');
    const mails = (await call(t, 'get', '/api/dev/mail?q=new.teacher', cast.admin.cookie)).body.mail as { text: string }[];
    expect(mails).toHaveLength(2);
    for (const m of mails) expect((await call(t, 'post', '/api/auth/invitations/lookup').send({ token: tokenIn({ ...m, to: '', subject: '', html: '' }) })).status).toBe(400);
  });

  it('lets a class’s instructor cancel the class’s own invitations; another instructor and students do not learn of them', async () => {
    expect((await call(t, 'post', `/api/classes/${cast.classId}/invitations`, cast.instructor.cookie).send({ email: 'hand@test.example', name: 'By Hand' })).status).toBe(201);
    const entry = InvitationEntryListSchema.parse((await call(t, 'get', '/api/admin/invitations', cast.admin.cookie)).body).invitations.find((i) => i.email === 'hand@test.example')!;
    expect(entry).toMatchObject({ className: 'Motor Control 1', state: 'open' });
    expect((await call(t, 'post', `/api/invitations/${entry.id}/cancel`, cast.otherInstructor.cookie).send({})).status).toBe(404);
    expect((await call(t, 'post', `/api/invitations/${entry.id}/cancel`, cast.studentA.cookie).send({})).status).toBe(404);
    expect((await call(t, 'post', `/api/invitations/${entry.id}/cancel`).send({})).status).toBe(401);
    expect((await call(t, 'post', `/api/invitations/${entry.id}/cancel`, cast.instructor.cookie).send({})).status).toBe(200);
    expect((await call(t, 'post', `/api/invitations/${entry.id}/resend`, cast.instructor.cookie).send({})).status).toBe(201);
    expect((await call(t, 'get', '/api/admin/invitations', cast.instructor.cookie)).status).toBe(403);
  });
});

describe('the mailbox search', () => {
  it('finds mail by part of the address, subject or text, any case, and takes LIKE wildcards literally', async () => {
    const all = (await call(t, 'get', '/api/dev/mail', cast.admin.cookie)).body.mail as unknown[];
    const hand = (await call(t, 'get', '/api/dev/mail?q=HAND%40test', cast.admin.cookie)).body.mail as { to: string }[];
    expect(hand.length).toBeGreaterThan(0);
    expect(hand.length).toBeLessThan(all.length);
    expect(hand.every((m) => m.to.includes('hand@test.example'))).toBe(true);
    expect((await call(t, 'get', '/api/dev/mail?q=%25', cast.admin.cookie)).body.mail).toEqual([]);
    const long = await call(t, 'get', `/api/dev/mail?q=${'x'.repeat(201)}`, cast.admin.cookie);
    expect(long.status).toBe(400);
    expect(long.body.error.fields).toHaveProperty('q');
  });
});
