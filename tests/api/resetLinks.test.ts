/**
 * Password-reset links: the request answers the same, in the same way, for every address and
 * does not wait for the lookup or the mail; only an account's newest link works.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, person, signIn, type Person } from './helpers/fixtures';
import { tokenIn, waitForMail, type Mail } from './helpers/mailbox';
import type { OutgoingMail } from '../../server/mail/mailer';

let t: TestApp;
let admin: Person;
beforeAll(async () => {
  t = await createTestApp();
  admin = await person(t, 'admin@test.example', 'admin');
});
afterAll(() => t.close());

const requestReset = (email: string) => call(t, 'post', '/api/auth/password-reset').send({ email });
const confirm = (token: string, password: string) => call(t, 'post', '/api/auth/password-reset/confirm').send({ token, password });

/** Every mail to the address `to` so far, oldest first (the mailbox lists newest first, by the fake clock). */
async function mailsTo(to: string): Promise<Mail[]> {
  const box = (await call(t, 'get', '/api/dev/mail', admin.cookie)).body.mail as Mail[];
  return box.filter((m) => m.to.replace(/^.*</, '').replace(/>$/, '').toLowerCase() === to.toLowerCase()).reverse();
}

/** Asks for a link and waits until the `n`-th mail to the address has arrived; answers its token. */
async function newLink(email: string, n: number): Promise<string> {
  // A second later than the last mail, so the mailbox's order is the order of sending.
  t.clock.advance(1000);
  await requestReset(email);
  const deadline = Date.now() + 5000;
  while (Date.now() < deadline) {
    const mails = await mailsTo(email);
    if (mails.length >= n) return tokenIn(mails[n - 1]!);
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`mail ${n} to ${email} did not arrive`);
}

describe('asking for a reset link', () => {
  it('answers a known and an unknown address with the same status, headers that matter and body', async () => {
    await addUser(t, 'known@test.example', 'student');
    const known = await requestReset('known@test.example');
    const unknown = await requestReset('nobody.here@test.example');
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(known.status);
    expect(unknown.body).toEqual(known.body);
    expect(unknown.headers['content-type']).toBe(known.headers['content-type']);
    expect(unknown.headers['content-length']).toBe(known.headers['content-length']);
    expect(unknown.headers['set-cookie']).toEqual(known.headers['set-cookie']);
    await waitForMail(t, admin.cookie, 'known@test.example');
    expect(await mailsTo('nobody.here@test.example')).toEqual([]);
  });

  it('answers before the mail has gone: the response does not wait for the mailer', async () => {
    await addUser(t, 'slow.mail@test.example', 'student');
    const realSend = t.mailer.send;
    let release!: () => void;
    const gate = new Promise<void>((resolve) => (release = resolve));
    const held: OutgoingMail[] = [];
    t.mailer.send = async (mail) => {
      held.push(mail);
      await gate;
      return realSend.call(t.mailer, mail);
    };
    try {
      const res = await requestReset('slow.mail@test.example');
      // The answer is here while the mail is still held at the mailer.
      expect(res.status).toBe(202);
      await expect.poll(() => held.length).toBe(1);
      expect(await mailsTo('slow.mail@test.example')).toEqual([]);
      release();
      await waitForMail(t, admin.cookie, 'slow.mail@test.example');
    } finally {
      release();
      t.mailer.send = realSend;
    }
  });

  it('sends nothing to a deactivated account, and still answers the same', async () => {
    const who = await addUser(t, 'inactive@test.example', 'student');
    await call(t, 'post', `/api/admin/users/${who.id}/deactivate`, admin.cookie);
    const res = await requestReset('inactive@test.example');
    expect(res.status).toBe(202);
    expect(res.body).toEqual((await requestReset('nobody.either@test.example')).body);
    // The next request's mail to a known address arriving shows the queue has moved past this one.
    await addUser(t, 'after.inactive@test.example', 'student');
    await requestReset('after.inactive@test.example');
    await waitForMail(t, admin.cookie, 'after.inactive@test.example');
    expect(await mailsTo('inactive@test.example')).toEqual([]);
  });

  it('mails one account at most 5 links an hour, however often it is asked', async () => {
    await addUser(t, 'flooded@test.example', 'student');
    for (let n = 1; n <= 5; n += 1) await newLink('flooded@test.example', n);
    for (let n = 0; n < 3; n += 1) expect((await requestReset('flooded@test.example')).status).toBe(202);
    await addUser(t, 'after.flood@test.example', 'student');
    await requestReset('after.flood@test.example');
    await waitForMail(t, admin.cookie, 'after.flood@test.example');
    expect(await mailsTo('flooded@test.example')).toHaveLength(5);
    t.clock.advance(60 * 60 * 1000);
    await newLink('flooded@test.example', 6);
  });
});

describe('only the newest link works', () => {
  it('refuses an older link once a newer one has been issued', async () => {
    await addUser(t, 'twice.asked@test.example', 'student');
    const first = await newLink('twice.asked@test.example', 1);
    const second = await newLink('twice.asked@test.example', 2);
    const old = await confirm(first, 'from-the-old-link');
    expect(old.status).toBe(400);
    expect(old.body.error.fields.token).toMatch(/replaced by a newer one/);
    expect((await confirm(second, 'from-the-new-link')).status).toBe(204);
    await expect(signIn(t, 'twice.asked@test.example', 'from-the-new-link')).resolves.toMatch(/^rw_session=/);
  });

  it('refuses an older link after a newer one has been used, and the used one too', async () => {
    await addUser(t, 'used.newer@test.example', 'student');
    const first = await newLink('used.newer@test.example', 1);
    const second = await newLink('used.newer@test.example', 2);
    expect((await confirm(second, 'set-by-newer-link')).status).toBe(204);
    expect((await confirm(first, 'set-by-older-link')).status).toBe(400);
    expect((await confirm(second, 'set-by-newer-again')).status).toBe(400);
    await expect(signIn(t, 'used.newer@test.example', 'set-by-newer-link')).resolves.toMatch(/^rw_session=/);
  });

  it('ends a self-requested link when an administrator sends a new one', async () => {
    const who = await addUser(t, 'helped@test.example', 'student');
    const own = await newLink('helped@test.example', 1);
    t.clock.advance(1000);
    expect((await call(t, 'post', `/api/admin/users/${who.id}/password-reset`, admin.cookie)).status).toBe(202);
    const fromAdmin = tokenIn((await mailsTo('helped@test.example'))[1]!);
    expect((await confirm(own, 'from-own-link-1')).status).toBe(400);
    expect((await confirm(fromAdmin, 'from-admin-link')).status).toBe(204);
  });

  it('lets exactly one of two uses of the same link at once succeed', async () => {
    await addUser(t, 'race@test.example', 'student');
    const token = await newLink('race@test.example', 1);
    const results = await Promise.all([confirm(token, 'racer-number-one'), confirm(token, 'racer-number-two')]);
    expect(results.map((r) => r.status).sort()).toEqual([204, 400]);
  });
});
