/**
 * Two app processes on one PostgreSQL database serve the same users: what one process does to a
 * session, a rate limit or a program is seen at once by the other, because none of it lives in a
 * process's memory.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '../../../server/auth/passwords';
import { openDatabase, type Database } from '../../../server/db/client';
import { insertUser } from '../../../server/db/users';
import type { ServerProcess } from '../helpers/serverProcess';
import { documentWithRungs, PASSWORD, sessionCookieOf } from '../helpers/fixtures';
import { TEST_SCRYPT } from '../helpers/testApp';
import { freshDatabase } from '../helpers/pgTemplate';
import { request, sharedEnv, startApp, stopProcess } from '../helpers/postgresProcesses';

/** Low, so the test reaches it; both processes read the same value. */
const ADDRESS_LIMIT = 4;

let drop: () => Promise<void>;
let database: Database;
let a: ServerProcess;
let b: ServerProcess;

beforeAll(async () => {
  const fresh = await freshDatabase();
  drop = fresh.drop;
  database = await openDatabase({ kind: 'postgres', url: fresh.url, poolSize: 2 }, { migrate: false });
  for (const email of ['ana@test.example', 'ben@test.example']) {
    await insertUser(database.orm, { email, name: email.split('@')[0], role: 'student', passwordHash: await hashPassword(PASSWORD, TEST_SCRYPT), createdAt: new Date() });
  }
  const env = sharedEnv(fresh.url, { AUTH_RATE_LIMIT: String(ADDRESS_LIMIT) });
  [a, b] = await Promise.all([startApp(env), startApp(env)]);
}, 120_000);

afterAll(async () => {
  await Promise.all([a, b].filter(Boolean).map((p) => stopProcess(p)));
  await database?.close();
  await drop?.();
});

async function signInOn(server: ServerProcess, email: string): Promise<string> {
  const res = await request(server.url, 'POST', '/api/auth/sign-in', { body: { email, password: PASSWORD } });
  expect(res.status).toBe(200);
  return sessionCookieOf(res.setCookie ?? undefined);
}

describe('two app processes on one PostgreSQL database', () => {
  it('runs as two processes, each reporting the shared driver', async () => {
    expect(a.pid).not.toBe(b.pid);
    for (const server of [a, b]) expect((await request(server.url, 'GET', '/api/health')).body).toMatchObject({ ok: true, db: 'postgres' });
  });

  it('refuses on one process a session signed out through the other', async () => {
    const cookie = await signInOn(a, 'ana@test.example');
    expect((await request(b.url, 'GET', '/api/me', { cookie })).status).toBe(200);
    expect((await request(a.url, 'POST', '/api/auth/sign-out', { cookie })).status).toBe(204);
    expect((await request(b.url, 'GET', '/api/me', { cookie })).status).toBe(401);
    expect((await request(a.url, 'GET', '/api/me', { cookie })).status).toBe(401);
  });

  it('counts one address limit across both processes', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < ADDRESS_LIMIT + 1; i += 1) {
      const server = i % 2 === 0 ? a : b;
      statuses.push((await request(server.url, 'POST', '/api/auth/password-reset', { body: { email: 'nobody@test.example' } })).status);
    }
    // Four answered (two on each process), the fifth refused: neither process alone saw more than three.
    expect(statuses).toEqual([202, 202, 202, 202, 429]);
  });

  it('gives one 201 and one 409 when both processes save on the same version at once', async () => {
    const cookie = await signInOn(a, 'ben@test.example');
    const created = await request(a.url, 'POST', '/api/programs', { cookie, body: { title: 'Shared', document: documentWithRungs(1) } });
    expect(created.status).toBe(201);
    const id = created.body.program.id as string;
    for (let round = 0; round < 5; round += 1) {
      const base = round + 1;
      const saves = await Promise.all(
        [a, b].map((server, i) => request(server.url, 'POST', `/api/programs/${id}/versions`, { cookie, body: { baseVersion: base, document: documentWithRungs(2 + i), message: `from ${i}` } })),
      );
      expect(saves.map((s) => s.status).sort()).toEqual([201, 409]);
      const loser = saves.find((s) => s.status === 409)!;
      expect(loser.body.error.code).toBe('version_conflict');
      expect(loser.body.error.details.head.number).toBe(base + 1);
    }
    const versions = await request(b.url, 'GET', `/api/programs/${id}/versions`, { cookie });
    expect(versions.body.versions.map((v: { number: number }) => v.number).sort((x: number, y: number) => x - y)).toEqual([1, 2, 3, 4, 5, 6]);
  });
});
