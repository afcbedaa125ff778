/**
 * Sign-up with a join code without account discovery: the same 202 for every address, the mail
 * sent after answering, and the account made only from the mailed link.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SessionResponseSchema, SignUpAcceptedSchema, SignUpViewSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, person, sessionCookieOf, signIn, type Person } from './helpers/fixtures';
import { tokenIn, waitForMail, type Mail } from './helpers/mailbox';
import { insertClass } from '../../server/db/classes';
import { SIGN_UP_TOKEN_MS } from '../../server/auth/oneTimeTokens';
import type { Mailer } from '../../server/mail/mailer';

let t: TestApp;
let admin: Person;
let classId: string;
beforeAll(async () => {
  t = await createTestApp();
  admin = await person(t, 'admin@test.example', 'admin');
  const teacher = await addUser(t, 'teacher@test.example', 'instructor');
  await addUser(t, 'Sam.Student@Test.example', 'student');
  const cls = await insertClass(t.database.orm, { name: 'MC1', term: 'Fall', instructorId: teacher.id, joinCode: 'JOIN-1234', now: t.clock.now() });
  classId = cls!.id;
});
afterAll(() => t.close());

const signUp = (app: TestApp, email: string, joinCode = 'JOIN-1234', name = 'New One') => call(app, 'post', '/api/auth/sign-up').send({ email, name, joinCode });

async function mailbox(app: TestApp, cookie: string): Promise<Mail[]> {
  return (await call(app, 'get', '/api/dev/mail', cookie)).body.mail as Mail[];
}

describe('asking to sign up', () => {
  it('answers a new address, an existing one and an existing one in another letter case with the same 202 body', async () => {
    const fresh = await signUp(t, 'fresh.one@test.example');
    const existing = await signUp(t, 'sam.student@test.example');
    const shouting = await signUp(t, 'SAM.STUDENT@TEST.EXAMPLE');
    for (const res of [fresh, existing, shouting]) {
      expect(res.status).toBe(202);
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    expect(SignUpAcceptedSchema.parse(fresh.body).message).toMatch(/^Check your e-mail/);
    expect(existing.body).toEqual(fresh.body);
    expect(shouting.body).toEqual(fresh.body);
  });

  it('mails a new address a link to finish, and an existing one that it has an account (no link that makes one)', async () => {
    await signUp(t, 'second.fresh@test.example');
    await signUp(t, 'sam.student@test.example');
    const finish = await waitForMail(t, admin.cookie, 'second.fresh@test.example');
    expect(finish.subject).toBe('Finish creating your Rungwright account');
    expect(finish.text).toMatch(/\/join\/finish#token=[\w-]+/);
    expect(finish.text).toContain('"MC1"');
    const exists = await waitForMail(t, admin.cookie, 'sam.student@test.example', 'You already have');
    expect(exists.text).toMatch(/\/sign-in/);
    expect(exists.text).not.toMatch(/#token=/);
    expect(exists.text).toMatch(/join code/);
  });

  it('makes no account before the link is used', async () => {
    await signUp(t, 'not.yet@test.example');
    await waitForMail(t, admin.cookie, 'not.yet@test.example');
    const res = await call(t, 'post', '/api/auth/sign-in').send({ email: 'not.yet@test.example', password: 'anything-at-all' });
    expect(res.status).toBe(401);
    const users = (await call(t, 'get', '/api/admin/users', admin.cookie)).body.users as { email: string }[];
    expect(users.map((u) => u.email)).not.toContain('not.yet@test.example');
  });

  it('answers before any mail goes out: what depends on the address runs after the answer', async () => {
    let release: () => void = () => {};
    const held = new Promise<void>((resolve) => (release = resolve));
    const holdBack = (real: Mailer): Mailer => ({
      ...real,
      send: async (mail) => {
        await held;
        await real.send(mail);
      },
    });
    const gated = await createTestApp({}, { wrapMailer: holdBack });
    try {
      const boss = await person(gated, 'boss@test.example', 'admin');
      await addUser(gated, 'known@test.example', 'student');
      await insertClass(gated.database.orm, { name: 'Gated', term: 'Now', instructorId: boss.user.id, joinCode: 'GATE-0001', now: gated.clock.now() });
      const known = await signUp(gated, 'known@test.example', 'GATE-0001');
      const unknown = await signUp(gated, 'unknown@test.example', 'GATE-0001');
      expect([known.status, unknown.status]).toEqual([202, 202]);
      expect(known.body).toEqual(unknown.body);
      expect(await mailbox(gated, boss.cookie)).toEqual([]);
      release();
      await waitForMail(gated, boss.cookie, 'known@test.example', 'You already have');
      await waitForMail(gated, boss.cookie, 'unknown@test.example', 'Finish creating');
    } finally {
      release();
      await gated.close();
    }
  });

  it('refuses an unknown join code naming the field, with the same answer for a known and an unknown address', async () => {
    const known = await signUp(t, 'sam.student@test.example', 'ZZZZ-ZZZZ');
    const unknown = await signUp(t, 'nobody.here@test.example', 'ZZZZ-ZZZZ');
    expect(known.status).toBe(400);
    expect(known.body.error.fields.joinCode).toMatch(/no class has this join code/);
    expect(unknown.body).toEqual(known.body);
  });

  it('names each bad field (400): a malformed e-mail, a missing name, a malformed join code', async () => {
    const res = await call(t, 'post', '/api/auth/sign-up').send({ email: 'not-an-address', name: '', joinCode: '!' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'joinCode', 'name']);
  });
});

describe('finishing a sign-up from the mailed link', () => {
  async function linkFor(email: string, name = 'Finn Ish'): Promise<string> {
    await signUp(t, email, 'join-1234', name);
    return tokenIn(await waitForMail(t, admin.cookie, email, 'Finish creating'));
  }

  it('shows the address, name and class, then creates the account with the chosen password, enrols it and signs it in, once', async () => {
    const token = await linkFor('finn.ish@test.example');
    const lookup = await call(t, 'post', '/api/auth/sign-up/lookup').send({ token });
    expect(lookup.status).toBe(200);
    expect(SignUpViewSchema.parse(lookup.body.signUp)).toMatchObject({ email: 'finn.ish@test.example', name: 'Finn Ish', className: 'MC1' });

    const done = await call(t, 'post', '/api/auth/sign-up/finish').send({ token, name: 'Finn Ish', password: 'long-enough-pw' });
    expect(done.status).toBe(201);
    expect(SessionResponseSchema.parse(done.body).user).toMatchObject({ email: 'finn.ish@test.example', role: 'student', name: 'Finn Ish' });
    const classes = await call(t, 'get', '/api/classes', sessionCookieOf(done.headers['set-cookie']));
    expect(classes.body.classes.map((c: { id: string }) => c.id)).toEqual([classId]);
    await expect(signIn(t, 'finn.ish@test.example', 'long-enough-pw')).resolves.toMatch(/^rw_session=/);

    const again = await call(t, 'post', '/api/auth/sign-up/finish').send({ token, name: 'Again', password: 'long-enough-pw' });
    expect(again.status).toBe(400);
    expect(again.body.error.fields).toHaveProperty('token');
  });

  it('ends the older link when a newer one is sent', async () => {
    const older = await linkFor('twice@test.example');
    await signUp(t, 'twice@test.example', 'JOIN-1234');
    await expect.poll(async () => (await mailbox(t, admin.cookie)).filter((m) => m.to.includes('twice@')).length).toBe(2);
    const newer = tokenIn((await mailbox(t, admin.cookie)).filter((m) => m.to.includes('twice@')).find((m) => tokenIn(m) !== older)!);
    expect((await call(t, 'post', '/api/auth/sign-up/lookup').send({ token: older })).status).toBe(400);
    expect((await call(t, 'post', '/api/auth/sign-up/finish').send({ token: older, name: 'Old', password: 'long-enough-pw' })).status).toBe(400);
    expect((await call(t, 'post', '/api/auth/sign-up/finish').send({ token: newer, name: 'New', password: 'long-enough-pw' })).status).toBe(201);
  });

  it('answers 409 and says to sign in when the address got an account meanwhile', async () => {
    const token = await linkFor('meanwhile@test.example');
    await addUser(t, 'meanwhile@test.example', 'student');
    const res = await call(t, 'post', '/api/auth/sign-up/finish').send({ token, name: 'Mean While', password: 'long-enough-pw' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/sign in/);
  });

  it('refuses a short password naming the field, and keeps the link usable', async () => {
    const token = await linkFor('short.pw@test.example');
    const res = await call(t, 'post', '/api/auth/sign-up/finish').send({ token, name: 'Short', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.password).toMatch(/at least 10/);
    expect((await call(t, 'post', '/api/auth/sign-up/lookup').send({ token })).status).toBe(200);
  });

  it('refuses the link after its 24 hours, and an invitation link is no sign-up link', async () => {
    const token = await linkFor('slow.finisher@test.example');
    t.clock.advance(SIGN_UP_TOKEN_MS + 1000);
    const late = await call(t, 'post', '/api/auth/sign-up/finish').send({ token, name: 'Slow', password: 'long-enough-pw' });
    expect(late.status).toBe(400);
    expect(late.body.error.fields.token).toMatch(/expired/);

    // The admin's session ran out with the clock: sign in again.
    const boss = await signIn(t, 'admin@test.example');
    await call(t, 'post', '/api/admin/instructor-invitations', boss).send({ email: 'not.a.signup@test.example' });
    const invitation = tokenIn(await waitForMail(t, boss, 'not.a.signup@test.example'));
    expect((await call(t, 'post', '/api/auth/sign-up/lookup').send({ token: invitation })).status).toBe(400);
  });
});
