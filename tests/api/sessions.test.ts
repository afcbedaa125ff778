/**
 * Sessions that end: sign-out (as a browser sends it), sign out everywhere, password changes and
 * resets, deactivation, and tokens the server cannot tie to an open session.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SignJWT } from 'jose';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, PASSWORD, person, sessionCookieOf, signIn, type Person } from './helpers/fixtures';
import { tokenIn, waitForMail } from './helpers/mailbox';
import { countOpenSessions, findSessionUser, insertSession, revokeSession } from '../../server/db/sessions';
import { setDeactivatedAt } from '../../server/db/users';
import { sessions } from '../../server/db/schema';
import { eq } from 'drizzle-orm';

let t: TestApp;
let admin: Person;
beforeAll(async () => {
  t = await createTestApp();
  admin = await person(t, 'admin@test.example', 'admin');
});
afterAll(() => t.close());

const me = (cookie: string) => call(t, 'get', '/api/me', cookie);

describe('signing out', () => {
  it('accepts the bodiless POST a browser sends (no Content-Type) and ends the session for good', async () => {
    await addUser(t, 'leaver@test.example', 'student');
    const cookie = await signIn(t, 'leaver@test.example');
    expect((await me(cookie)).status).toBe(200);
    // What fetch(url, { method: 'POST' }) sends: Content-Length 0 and no Content-Type.
    const out = await t.http.post('/api/auth/sign-out').set('Origin', t.origin).set('Cookie', cookie).set('Content-Length', '0');
    expect(out.status).toBe(204);
    expect(String(out.headers['set-cookie'])).toMatch(/rw_session=;/);
    // A copy of the cookie kept anywhere (another tab, a saved request) no longer works.
    const after = await me(cookie);
    expect(after.status).toBe(401);
    expect(after.body.error.code).toBe('unauthenticated');
  });

  it('ends only the session that signs out, not the same user\'s others', async () => {
    await addUser(t, 'two.tabs@test.example', 'student');
    const lab = await signIn(t, 'two.tabs@test.example');
    const home = await signIn(t, 'two.tabs@test.example');
    await call(t, 'post', '/api/auth/sign-out', lab);
    expect((await me(lab)).status).toBe(401);
    expect((await me(home)).status).toBe(200);
  });

  it('answers 204 to a sign-out without a session, or with one that has ended already', async () => {
    expect((await call(t, 'post', '/api/auth/sign-out')).status).toBe(204);
    await addUser(t, 'twice@test.example', 'student');
    const cookie = await signIn(t, 'twice@test.example');
    expect((await call(t, 'post', '/api/auth/sign-out', cookie)).status).toBe(204);
    expect((await call(t, 'post', '/api/auth/sign-out', cookie)).status).toBe(204);
  });

  it('still refuses a JSON-looking body that is not declared as JSON (415)', async () => {
    const res = await t.http.post('/api/auth/sign-out').set('Origin', t.origin).set('Content-Type', 'text/plain').send('{}');
    expect(res.status).toBe(415);
  });
});

describe('signing out everywhere', () => {
  it('ends every session of the user, this one included, and no one else\'s', async () => {
    const other = await person(t, 'bystander@test.example', 'student');
    await addUser(t, 'everywhere@test.example', 'student');
    const here = await signIn(t, 'everywhere@test.example');
    const there = await signIn(t, 'everywhere@test.example');
    // Both sessions in use (and so in the server's session cache) before they end.
    expect((await me(there)).status).toBe(200);
    const res = await call(t, 'post', '/api/auth/sign-out-everywhere', here);
    expect(res.status).toBe(204);
    expect(String(res.headers['set-cookie'])).toMatch(/rw_session=;/);
    expect((await me(here)).status).toBe(401);
    expect((await me(there)).status).toBe(401);
    expect((await me(other.cookie)).status).toBe(200);
    // Signing in again works as before.
    expect((await me(await signIn(t, 'everywhere@test.example'))).status).toBe(200);
  });
});

describe('changing one\'s own password', () => {
  it('needs the current password, names the field when it is wrong, and changes nothing then', async () => {
    const who = await person(t, 'changer.a@test.example', 'instructor');
    const res = await call(t, 'post', '/api/auth/password', who.cookie).send({ currentPassword: 'not-my-password', newPassword: 'a-brand-new-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ currentPassword: 'is not your current password' });
    expect((await me(who.cookie)).status).toBe(200);
    await expect(signIn(t, 'changer.a@test.example')).resolves.toMatch(/^rw_session=/);
  });

  it('refuses a new password equal to the current one or too short, naming newPassword', async () => {
    const who = await person(t, 'changer.b@test.example', 'student');
    const same = await call(t, 'post', '/api/auth/password', who.cookie).send({ currentPassword: PASSWORD, newPassword: PASSWORD });
    expect(same.status).toBe(400);
    expect(same.body.error.fields.newPassword).toMatch(/same as the current password/);
    const short = await call(t, 'post', '/api/auth/password', who.cookie).send({ currentPassword: PASSWORD, newPassword: 'short' });
    expect(short.body.error.fields.newPassword).toMatch(/at least 10/);
  });

  it('ends every other session and the old token of this one, and keeps this one going under a new token', async () => {
    const who = await person(t, 'changer.c@test.example', 'student');
    const elsewhere = await signIn(t, 'changer.c@test.example');
    expect((await me(elsewhere)).status).toBe(200);
    const res = await call(t, 'post', '/api/auth/password', who.cookie).send({ currentPassword: PASSWORD, newPassword: 'the-new-password-1' });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe('changer.c@test.example');
    const reissued = sessionCookieOf(res.headers['set-cookie']);
    expect(reissued).not.toBe(who.cookie);
    expect((await me(reissued)).status).toBe(200);
    expect((await me(who.cookie)).status).toBe(401);
    expect((await me(elsewhere)).status).toBe(401);
    expect(await countOpenSessions(t.database.orm, who.user.id, t.clock.now())).toBe(1);
    await expect(signIn(t, 'changer.c@test.example')).rejects.toThrow(/401/);
    await expect(signIn(t, 'changer.c@test.example', 'the-new-password-1')).resolves.toMatch(/^rw_session=/);
  });

  it('is for signed-in users only (401)', async () => {
    const res = await call(t, 'post', '/api/auth/password').send({ currentPassword: PASSWORD, newPassword: 'the-new-password-1' });
    expect(res.status).toBe(401);
  });
});

describe('a password reset', () => {
  it('ends every session of the account', async () => {
    const who = await person(t, 'reset.sessions@test.example', 'student');
    const second = await signIn(t, 'reset.sessions@test.example');
    expect((await me(second)).status).toBe(200);
    await call(t, 'post', '/api/auth/password-reset').send({ email: 'reset.sessions@test.example' });
    const token = tokenIn(await waitForMail(t, admin.cookie, 'reset.sessions@test.example'));
    expect((await call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password: 'after-the-reset-1' })).status).toBe(204);
    expect((await me(who.cookie)).status).toBe(401);
    expect((await me(second)).status).toBe(401);
    await expect(signIn(t, 'reset.sessions@test.example', 'after-the-reset-1')).resolves.toMatch(/^rw_session=/);
  });
});

describe('deactivation by an administrator', () => {
  it('ends the account\'s sessions at once and refuses its sign-in with a clear message, but only after the right password', async () => {
    const who = await person(t, 'deactivated@test.example', 'student');
    const res = await call(t, 'post', `/api/admin/users/${who.user.id}/deactivate`, admin.cookie);
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: who.user.id, deactivatedAt: t.clock.now().toISOString() });
    expect((await me(who.cookie)).status).toBe(401);

    const right = await call(t, 'post', '/api/auth/sign-in').send({ email: 'deactivated@test.example', password: PASSWORD });
    expect(right.status).toBe(403);
    expect(right.body.error.message).toMatch(/deactivated/);
    expect(right.headers['set-cookie']).toBeUndefined();
    // A wrong password learns nothing about the account's state.
    const wrong = await call(t, 'post', '/api/auth/sign-in').send({ email: 'deactivated@test.example', password: 'a-wrong-guess' });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('bad_credentials');

    const list = await call(t, 'get', '/api/admin/users', admin.cookie);
    expect(list.body.users.find((u: { id: string }) => u.id === who.user.id).deactivatedAt).not.toBeNull();
  });

  it('refuses a session row opened for a deactivated account (the join checks the user, not just the row)', async () => {
    const who = await person(t, 'row.check@test.example', 'student');
    await call(t, 'post', `/api/admin/users/${who.user.id}/deactivate`, admin.cookie);
    // Even a row that was not revoked (as if another process had opened it meanwhile) is refused.
    await insertSession(t.database.orm, { userId: who.user.id, now: t.clock.now(), expiresAt: new Date(t.clock.now().getTime() + 3_600_000) });
    expect((await me(who.cookie)).status).toBe(401);
  });

  it('lets the user sign in again once reactivated', async () => {
    const who = await person(t, 'comeback@test.example', 'instructor');
    await call(t, 'post', `/api/admin/users/${who.user.id}/deactivate`, admin.cookie);
    const back = await call(t, 'post', `/api/admin/users/${who.user.id}/reactivate`, admin.cookie);
    expect(back.status).toBe(200);
    expect(back.body.user.deactivatedAt).toBeNull();
    // The old session stays ended; a new sign-in works.
    expect((await me(who.cookie)).status).toBe(401);
    expect((await me(await signIn(t, 'comeback@test.example'))).status).toBe(200);
  });

  it('does not let an administrator deactivate their own account (409), and answers 404 for no such account', async () => {
    const self = await call(t, 'post', `/api/admin/users/${admin.user.id}/deactivate`, admin.cookie);
    expect(self.status).toBe(409);
    expect((await me(admin.cookie)).status).toBe(200);
    expect((await call(t, 'post', '/api/admin/users/00000000-0000-4000-8000-000000000000/deactivate', admin.cookie)).status).toBe(404);
    expect((await call(t, 'post', '/api/admin/users/not-a-uuid/reactivate', admin.cookie)).status).toBe(404);
  });
});

describe('an administrator sending a reset link', () => {
  it('mails the account a link that works (202 naming the address)', async () => {
    const who = await addUser(t, 'locked.out@test.example', 'student');
    const res = await call(t, 'post', `/api/admin/users/${who.id}/password-reset`, admin.cookie);
    expect(res.status).toBe(202);
    expect(res.body.sent.email).toBe('locked.out@test.example');
    const token = tokenIn(await waitForMail(t, admin.cookie, 'locked.out@test.example'));
    expect((await call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password: 'set-by-link-123' })).status).toBe(204);
    await expect(signIn(t, 'locked.out@test.example', 'set-by-link-123')).resolves.toMatch(/^rw_session=/);
  });

  it('refuses to send one to a deactivated account (409)', async () => {
    const who = await addUser(t, 'gone.away@test.example', 'student');
    await call(t, 'post', `/api/admin/users/${who.id}/deactivate`, admin.cookie);
    expect((await call(t, 'post', `/api/admin/users/${who.id}/password-reset`, admin.cookie)).status).toBe(409);
  });
});

describe('tokens without an open session', () => {
  const key = new TextEncoder().encode('test-session-key-0123456789abcdef');

  it('refuses a well-signed token from before session rows (no sid)', async () => {
    const who = await person(t, 'legacy@test.example', 'student');
    const iat = Math.floor(t.clock.now().getTime() / 1000);
    const legacy = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(who.user.id).setIssuer('rungwright').setIssuedAt(iat).setExpirationTime(iat + 3600).sign(key);
    expect((await me(`rw_session=${legacy}`)).status).toBe(401);
  });

  it('refuses a token whose row is missing, revoked, or names another user', async () => {
    const who = await person(t, 'rows@test.example', 'student');
    const other = await addUser(t, 'rows.other@test.example', 'student');
    const iat = Math.floor(t.clock.now().getTime() / 1000);
    const sign = (sub: string, sid: string) =>
      new SignJWT({ sid }).setProtectedHeader({ alg: 'HS256' }).setSubject(sub).setIssuer('rungwright').setIssuedAt(iat).setExpirationTime(iat + 3600).sign(key);
    const missing = await sign(who.user.id, '00000000-0000-4000-8000-000000000001');
    expect((await me(`rw_session=${missing}`)).status).toBe(401);
    const sid = await insertSession(t.database.orm, { userId: who.user.id, now: t.clock.now(), expiresAt: new Date(t.clock.now().getTime() + 3_600_000) });
    expect((await me(`rw_session=${await sign(who.user.id, sid)}`)).status).toBe(200);
    expect((await me(`rw_session=${await sign(other.id, sid)}`)).status).toBe(401);
    await revokeSession(t.database.orm, sid, t.clock.now());
    expect((await me(`rw_session=${await sign(who.user.id, sid)}`)).status).toBe(401);
  });

  it('answers a cookie with broken %-escapes as no session (401 where a session is needed, 200 elsewhere), never 500', async () => {
    const bad = 'rw_session=%E0%A4%A';
    const mine = await t.http.get('/api/me').set('Cookie', bad);
    expect(mine.status).toBe(401);
    expect(mine.body.error.code).toBe('unauthenticated');
    expect((await t.http.get('/api/health').set('Cookie', bad)).status).toBe(200);
    expect((await call(t, 'post', '/api/auth/sign-out', bad)).status).toBe(204);
    expect((await call(t, 'post', '/api/auth/sign-in', bad).send({ email: 'admin@test.example', password: PASSWORD })).status).toBe(200);
  });
});

describe('the session check where several processes share the database (no row caches)', () => {
  it('reads the row joined with its user: open passes; revoked, expired, another user\'s or a deactivated user\'s does not', async () => {
    const who = await addUser(t, 'joined@test.example', 'student');
    const other = await addUser(t, 'joined.other@test.example', 'student');
    const now = t.clock.now();
    const hour = new Date(now.getTime() + 3_600_000);
    const open = await insertSession(t.database.orm, { userId: who.id, now, expiresAt: hour });
    const revoked = await insertSession(t.database.orm, { userId: who.id, now, expiresAt: hour });
    await revokeSession(t.database.orm, revoked, now);
    // A transaction's handle never has the row caches: the same path a shared database takes.
    const seen = await t.database.orm.transaction(async (tx) => ({
      open: await findSessionUser(tx, open, who.id, now),
      revoked: await findSessionUser(tx, revoked, who.id, now),
      expired: await findSessionUser(tx, open, who.id, hour),
      otherUser: await findSessionUser(tx, open, other.id, now),
    }));
    expect(seen.open?.email).toBe('joined@test.example');
    expect(seen).toMatchObject({ revoked: null, expired: null, otherUser: null });
    await setDeactivatedAt(t.database.orm, who.id, now);
    expect(await t.database.orm.transaction((tx) => findSessionUser(tx, open, who.id, now))).toBeNull();
  });
});

describe('session rows', () => {
  it('expire with their token after 8 hours even if never revoked', async () => {
    const who = await person(t, 'long.day@test.example', 'student');
    t.clock.advance(8 * 60 * 60 * 1000);
    expect((await me(who.cookie)).status).toBe(401);
    admin = { ...admin, cookie: await signIn(t, 'admin@test.example') };
  });

  it('are swept on sign-in once ended (expired or revoked)', async () => {
    const who = await addUser(t, 'sweep@test.example', 'student');
    const now = t.clock.now();
    const old = await insertSession(t.database.orm, { userId: who.id, now: new Date(now.getTime() - 9 * 3_600_000), expiresAt: new Date(now.getTime() - 3_600_000) });
    const revoked = await insertSession(t.database.orm, { userId: who.id, now, expiresAt: new Date(now.getTime() + 3_600_000) });
    await revokeSession(t.database.orm, revoked, now);
    await signIn(t, 'sweep@test.example');
    const left = await t.database.orm.select({ id: sessions.id }).from(sessions).where(eq(sessions.userId, who.id));
    expect(left.map((r) => r.id)).not.toContain(old);
    expect(left.map((r) => r.id)).not.toContain(revoked);
    expect(left).toHaveLength(1);
  });
});
