import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SessionResponseSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, PASSWORD, signIn } from './helpers/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await addUser(t, 'Sam.Student@Test.example', 'student');
});
afterAll(() => t.close());

describe('sign-in', () => {
  it('signs in with the right password, sets an httpOnly SameSite=Lax Secure session cookie and answers the user', async () => {
    const res = await call(t, 'post', '/api/auth/sign-in').send({ email: 'sam.student@test.example', password: PASSWORD });
    expect(res.status).toBe(200);
    expect(SessionResponseSchema.parse(res.body).user).toMatchObject({ email: 'Sam.Student@Test.example', role: 'student' });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/rw_session=[^;]+/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).toMatch(/Secure/);
    expect(cookie).toMatch(/Max-Age=28800/);
  });

  it('answers a wrong password and an unknown e-mail alike with 401 bad_credentials', async () => {
    const wrong = await call(t, 'post', '/api/auth/sign-in').send({ email: 'sam.student@test.example', password: 'nope-nope-nope' });
    const unknown = await call(t, 'post', '/api/auth/sign-in').send({ email: 'nobody@test.example', password: 'nope-nope-nope' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('bad_credentials');
  });

  it('names the bad field when the e-mail is malformed (400)', async () => {
    const res = await call(t, 'post', '/api/auth/sign-in').send({ email: 'not-an-address', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(res.body.error.fields).toHaveProperty('email');
  });
});

describe('GET /api/me and sign-out', () => {
  it('answers 401 without a session', async () => {
    const res = await t.http.get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('answers the signed-in user, and 401 for a tampered token', async () => {
    const cookie = await signIn(t, 'sam.student@test.example');
    const me = await call(t, 'get', '/api/me', cookie);
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('Sam.Student@Test.example');
    const tampered = await call(t, 'get', '/api/me', `${cookie.slice(0, -3)}abc`);
    expect(tampered.status).toBe(401);
  });

  it('expires the session after 8 hours of the injected clock', async () => {
    const cookie = await signIn(t, 'sam.student@test.example');
    t.clock.advance(8 * 60 * 60 * 1000 - 60_000);
    expect((await call(t, 'get', '/api/me', cookie)).status).toBe(200);
    t.clock.advance(2 * 60_000);
    expect((await call(t, 'get', '/api/me', cookie)).status).toBe(401);
  });

  it('clears the cookie on sign-out', async () => {
    const res = await call(t, 'post', '/api/auth/sign-out').send({});
    expect(res.status).toBe(204);
    expect(String(res.headers['set-cookie'])).toMatch(/rw_session=;.*Expires=Thu, 01 Jan 1970/);
  });
});

describe('JSON only', () => {
  it('answers a form-encoded body with 415', async () => {
    const res = await call(t, 'post', '/api/auth/sign-in').type('form').send('email=a@b.example&password=x');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });
});

describe('rate limiting', () => {
  it('answers 429 after the allowed number of sign-in attempts', async () => {
    const limited = await createTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 4; i += 1) {
        const res = await call(limited, 'post', '/api/auth/sign-in').send({ email: 'who@test.example', password: 'guess-guess' });
        statuses.push(res.status);
      }
      expect(statuses).toEqual([401, 401, 401, 429]);
      const last = await call(limited, 'post', '/api/auth/sign-in').send({ email: 'who@test.example', password: 'guess-guess' });
      expect(last.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });
});
