/**
 * Sign-in throttling (server/auth/signInThrottle.ts): failures per account with a doubling
 * back-off, failures per address, successes never counted, X-Forwarded-For only under TRUST_PROXY.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readConfig } from '../../server/config';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, PASSWORD, person } from './helpers/fixtures';
import { backoffAfter } from '../../server/db/backoffCounters';
import { ACCOUNT_POLICY } from '../../server/auth/signInThrottle';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const attempt = (app: TestApp, email: string, password: string, forwardedFor?: string) => {
  const req = call(app, 'post', '/api/auth/sign-in');
  return (forwardedFor ? req.set('X-Forwarded-For', forwardedFor) : req).send({ email, password });
};
const SECOND = 1000;

describe('the per-account back-off', () => {
  it('waits 30 s after the 5th failure, doubling with each further failure up to 15 min', () => {
    const waits = [4, 5, 6, 7, 8, 9, 10, 11, 40].map((n) => backoffAfter(n, ACCOUNT_POLICY));
    expect(waits).toEqual([null, 30 * SECOND, 60 * SECOND, 120 * SECOND, 240 * SECOND, 480 * SECOND, 900 * SECOND, 900 * SECOND, 900 * SECOND]);
  });

  it('lets 5 failures through, then refuses with 429 and Retry-After until the wait is over, then doubles it', async () => {
    await addUser(t, 'guessed@test.example', 'student');
    const statuses: number[] = [];
    for (let i = 0; i < 5; i += 1) statuses.push((await attempt(t, 'guessed@test.example', `wrong-${i}`)).status);
    expect(statuses).toEqual([401, 401, 401, 401, 401]);

    const held = await attempt(t, 'guessed@test.example', 'wrong-5');
    expect(held.status).toBe(429);
    expect(held.body.error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/for this account; try again in 30 seconds/) });
    expect(held.headers['retry-after']).toBe('30');
    // Even the right password waits: the back-off is not a password check.
    expect((await attempt(t, 'guessed@test.example', PASSWORD)).status).toBe(429);

    t.clock.advance(30 * SECOND);
    expect((await attempt(t, 'guessed@test.example', 'wrong-6')).status).toBe(401);
    const doubled = await attempt(t, 'guessed@test.example', 'wrong-7');
    expect(doubled.status).toBe(429);
    expect(doubled.headers['retry-after']).toBe('60');

    t.clock.advance(60 * SECOND);
    expect((await attempt(t, 'guessed@test.example', PASSWORD)).status).toBe(200);
  });

  it('is cleared by a success: failures before it do not add up with failures after it', async () => {
    await addUser(t, 'typo.prone@test.example', 'student');
    for (let round = 0; round < 3; round += 1) {
      for (let i = 0; i < 4; i += 1) expect((await attempt(t, 'typo.prone@test.example', 'typo-typo')).status).toBe(401);
      expect((await attempt(t, 'typo.prone@test.example', PASSWORD)).status).toBe(200);
    }
  });

  it('throttles an address without an account exactly like one with (no account discovery)', async () => {
    await addUser(t, 'real.one@test.example', 'student');
    const known: { status: number; body: unknown }[] = [];
    const unknown: { status: number; body: unknown }[] = [];
    for (let i = 0; i < 7; i += 1) {
      const k = await attempt(t, 'real.one@test.example', 'nope-nope');
      const u = await attempt(t, 'not.real@test.example', 'nope-nope');
      known.push({ status: k.status, body: k.body });
      unknown.push({ status: u.status, body: u.body });
    }
    expect(unknown).toEqual(known);
    expect(known.map((r) => r.status)).toEqual([401, 401, 401, 401, 401, 429, 429]);
  });

  it('gives a burst of attempts sent at once no more tries than attempts sent one by one', async () => {
    await addUser(t, 'burst@test.example', 'student');
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => attempt(t, 'burst@test.example', `burst-${i}`)));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 401)).toHaveLength(5);
    expect(statuses.filter((s) => s === 429)).toHaveLength(15);
  });

  it('also guards the current password of a password change', async () => {
    const who = await person(t, 'session.left.open@test.example', 'student');
    const change = (currentPassword: string) => call(t, 'post', '/api/auth/password', who.cookie).send({ currentPassword, newPassword: 'taken-over-password' });
    for (let i = 0; i < 5; i += 1) expect((await change(`guess-${i}`)).status).toBe(400);
    const held = await change(PASSWORD);
    expect(held.status).toBe(429);
    expect(held.body.error.code).toBe('rate_limited');
  });
});

describe('the per-address limit', () => {
  it('counts failures only: a class signing in from one address is never refused, however many succeed', async () => {
    const classroom = await createTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      for (let i = 0; i < 6; i += 1) await addUser(classroom, `pupil${i}@test.example`, 'student');
      for (let round = 0; round < 2; round += 1) {
        for (let i = 0; i < 6; i += 1) expect((await attempt(classroom, `pupil${i}@test.example`, PASSWORD)).status).toBe(200);
      }
      // Two typos do not reach the limit of 3 either.
      expect((await attempt(classroom, 'pupil0@test.example', 'typo-one')).status).toBe(401);
      expect((await attempt(classroom, 'pupil1@test.example', 'typo-two')).status).toBe(401);
      expect((await attempt(classroom, 'pupil2@test.example', PASSWORD)).status).toBe(200);
    } finally {
      await classroom.close();
    }
  });

  it('gives a burst of wrong passwords sent at once no more failures than the limit', async () => {
    const burst = await createTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      const statuses = await Promise.all(Array.from({ length: 12 }, (_, i) => attempt(burst, `sprayed${i}@test.example`, 'Summer2026!').then((r) => r.status)));
      expect(statuses.filter((s) => s === 401)).toHaveLength(3);
      expect(statuses.filter((s) => s === 429)).toHaveLength(9);
    } finally {
      await burst.close();
    }
  });

  it('refuses an address after AUTH_RATE_LIMIT failures on any accounts, for the rest of 15 minutes', async () => {
    const sprayed = await createTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      await addUser(sprayed, 'victim@test.example', 'student');
      const statuses: number[] = [];
      for (const email of ['a@test.example', 'b@test.example', 'c@test.example', 'victim@test.example']) statuses.push((await attempt(sprayed, email, 'Summer2026!')).status);
      expect(statuses).toEqual([401, 401, 401, 429]);
      const held = await attempt(sprayed, 'victim@test.example', PASSWORD);
      expect(held.body.error.message).toMatch(/from this network/);
      sprayed.clock.advance(15 * 60 * SECOND);
      expect((await attempt(sprayed, 'victim@test.example', PASSWORD)).status).toBe(200);
    } finally {
      await sprayed.close();
    }
  });
});

describe('X-Forwarded-For', () => {
  it('is ignored without TRUST_PROXY: a client cannot pick a new address for each guess', async () => {
    const direct = await createTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 4; i += 1) statuses.push((await attempt(direct, `x${i}@test.example`, 'guess-guess', `203.0.113.${i + 1}`)).status);
      expect(statuses).toEqual([401, 401, 401, 429]);
    } finally {
      await direct.close();
    }
  });

  it('names the client when TRUST_PROXY trusts the proxy it comes through', async () => {
    const proxied = await createTestApp({ AUTH_RATE_LIMIT: '3', TRUST_PROXY: 'loopback' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 4; i += 1) statuses.push((await attempt(proxied, `y${i}@test.example`, 'guess-guess', `203.0.113.${i + 1}`)).status);
      expect(statuses).toEqual([401, 401, 401, 401]);
      // One client behind the proxy is still counted as one.
      for (let i = 0; i < 2; i += 1) await attempt(proxied, `z${i}@test.example`, 'guess-guess', '203.0.113.1');
      expect((await attempt(proxied, 'z9@test.example', 'guess-guess', '203.0.113.1')).status).toBe(429);
    } finally {
      await proxied.close();
    }
  });

  it('TRUST_PROXY accepts false, true, a hop count or a list, and a bad entry stops the boot with one line', () => {
    for (const value of ['false', 'true', '1', 'loopback', '10.0.0.0/8, 127.0.0.1']) expect(readConfig({ TRUST_PROXY: value }).ok).toBe(true);
    const bad = readConfig({ TRUST_PROXY: 'loopback, proxy.example' });
    expect(bad).toEqual({ ok: false, error: expect.stringMatching(/^Bad environment: TRUST_PROXY .*proxy\.example/) });
  });
});
