import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, person, sessionCookieOf, signIn, type Person } from './helpers/fixtures';
import { tokenIn, waitForMail } from './helpers/mailbox';

let t: TestApp;
let admin: Person;
beforeAll(async () => {
  t = await createTestApp();
  admin = await person(t, 'admin@test.example', 'admin');
});
afterAll(() => t.close());

describe('instructor invitation, end to end through the local SMTP server', () => {
  it('mails a one-time link that creates an instructor account and works only once', async () => {
    const sent = await call(t, 'post', '/api/admin/instructor-invitations', admin.cookie).send({ email: 'new.teacher@test.example', name: 'New Teacher' });
    expect(sent.status).toBe(201);
    expect(sent.body.invitation).toMatchObject({ email: 'new.teacher@test.example', role: 'instructor' });

    const mail = await waitForMail(t, admin.cookie, 'new.teacher@test.example');
    expect(mail.subject).toBe('Your Rungwright invitation');
    expect(mail.html).toContain('<a href="http://127.0.0.1:3000/accept-invitation#token=');
    const token = tokenIn(mail);

    const lookup = await call(t, 'post', '/api/auth/invitations/lookup').send({ token });
    expect(lookup.body.invitation).toMatchObject({ email: 'new.teacher@test.example', role: 'instructor', name: 'New Teacher' });

    const accepted = await call(t, 'post', '/api/auth/invitations/accept').send({ token, name: 'Nia Teacher', password: 'a-long-password' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({ role: 'instructor', name: 'Nia Teacher' });
    const me = await call(t, 'get', '/api/me', sessionCookieOf(accepted.headers['set-cookie']));
    expect(me.body.user.email).toBe('new.teacher@test.example');

    const again = await call(t, 'post', '/api/auth/invitations/accept').send({ token, name: 'Again', password: 'a-long-password' });
    expect(again.status).toBe(400);
    expect(again.body.error.fields).toHaveProperty('token');
  });

  it('refuses inviting an address that already has an account (409) and a malformed one (400)', async () => {
    expect((await call(t, 'post', '/api/admin/instructor-invitations', admin.cookie).send({ email: 'admin@test.example' })).status).toBe(409);
    const bad = await call(t, 'post', '/api/admin/instructor-invitations', admin.cookie).send({ email: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('email');
  });
});

describe('password reset, end to end through the local SMTP server', () => {
  it('gives the same answer for a known and an unknown address and mails only the known one', async () => {
    await person(t, 'forgetful@test.example', 'student');
    const known = await call(t, 'post', '/api/auth/password-reset').send({ email: 'FORGETFUL@test.example' });
    const unknown = await call(t, 'post', '/api/auth/password-reset').send({ email: 'ghost@test.example' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    await waitForMail(t, admin.cookie, 'forgetful@test.example');
    const box = (await call(t, 'get', '/api/dev/mail', admin.cookie)).body.mail as { to: string }[];
    expect(box.some((m) => m.to.includes('ghost@'))).toBe(false);
  });

  it('sets a new password with the mailed token, once', async () => {
    await person(t, 'reset.me@test.example', 'student');
    await call(t, 'post', '/api/auth/password-reset').send({ email: 'reset.me@test.example' });
    const token = tokenIn(await waitForMail(t, admin.cookie, 'reset.me@test.example'));
    const done = await call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password: 'brand-new-password' });
    expect(done.status).toBe(204);
    await expect(signIn(t, 'reset.me@test.example', 'brand-new-password')).resolves.toMatch(/^rw_session=/);
    const reuse = await call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password: 'another-password' });
    expect(reuse.status).toBe(400);
  });

  it('refuses a reset token after its hour is up', async () => {
    await person(t, 'slow@test.example', 'student');
    await call(t, 'post', '/api/auth/password-reset').send({ email: 'slow@test.example' });
    const token = tokenIn(await waitForMail(t, admin.cookie, 'slow@test.example'));
    t.clock.advance(60 * 60 * 1000 + 1000);
    const res = await call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password: 'too-late-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.token).toMatch(/expired/);
  });

  it('names the token field when it is malformed', async () => {
    const res = await call(t, 'post', '/api/auth/password-reset/confirm').send({ token: 'short', password: 'whatever-long' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('token');
  });
});

describe('GET /api/dev/mail', () => {
  it('is off (404 mail_disabled) when SMTP_URL points at a real mail server', async () => {
    const real = await createTestApp({ SMTP_URL: 'smtp://127.0.0.1:1' });
    try {
      const boss = await person(real, 'boss@test.example', 'admin');
      const res = await call(real, 'get', '/api/dev/mail', boss.cookie);
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('mail_disabled');
    } finally {
      await real.close();
    }
  });
});
