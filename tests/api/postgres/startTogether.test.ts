/**
 * Several processes starting at once on an empty PostgreSQL database: one applies the migrations and
 * seeds the first start under the advisory lock, the others wait and find it done. Then
 * `create-admin` works on the shared database (no DATA_DIR involved).
 */
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { createAdmin } from '../../../server/cli/createAdmin';
import { DEMO_ACCOUNTS } from '../../../server/db/demoAccounts';
import { MIGRATIONS_FOLDER } from '../../../server/db/client';
import { systemClock } from '../../../server/clock';
import type { ServerProcess } from '../helpers/serverProcess';
import { databaseUrl } from '../helpers/postgresDatabases';
import { request, sharedEnv, startApp, stopProcess } from '../helpers/postgresProcesses';
import { TEST_SCRYPT } from '../helpers/testApp';

const name = `rw_empty_${randomBytes(4).toString('hex')}`;
let url: string;
let apps: ServerProcess[] = [];

async function onAdmin<T>(target: string, work: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: target });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  await onAdmin(inject('pgAdminUrl'), (c) => c.query(`create database ${name}`));
  url = databaseUrl(inject('pgAdminUrl'), name);
});

afterAll(async () => {
  await Promise.all(apps.map((p) => stopProcess(p)));
  await onAdmin(inject('pgAdminUrl'), (c) => c.query(`drop database if exists ${name} with (force)`));
});

describe('processes starting together on an empty PostgreSQL database', () => {
  it('migrates once and seeds once, and every process serves the result', async () => {
    apps = await Promise.all([1, 2, 3].map(() => startApp(sharedEnv(url, { DEMO: 'on' }))));
    const journal = JSON.parse(readFileSync(`${MIGRATIONS_FOLDER}/meta/_journal.json`, 'utf8')) as { entries: unknown[] };
    const counts = await onAdmin(url, async (c) => ({
      migrations: Number((await c.query('select count(*) as n from drizzle.__drizzle_migrations')).rows[0].n),
      users: Number((await c.query('select count(*) as n from users')).rows[0].n),
      classes: Number((await c.query('select count(*) as n from classes')).rows[0].n),
    }));
    expect(counts).toEqual({ migrations: journal.entries.length, users: DEMO_ACCOUNTS.length, classes: 1 });
    for (const app of apps) {
      const admin = DEMO_ACCOUNTS[0]!;
      expect((await request(app.url, 'POST', '/api/auth/sign-in', { body: { email: admin.email, password: admin.password } })).status).toBe(200);
    }
  });

  it('creates an administrator on the shared database with create-admin', async () => {
    let err = '';
    const code = await createAdmin(['--email', 'rowan.pike@college.example', '--name', 'Rowan Pike'], {
      env: { DATABASE_URL: url, JWT_SECRET: 'create-admin-test-secret-0123456789abcdef' },
      readStdin: async () => 'panel-lamp-test-42',
      stdout: () => undefined,
      stderr: (t) => (err += t),
      clock: systemClock,
      passwordParams: TEST_SCRYPT,
    });
    expect(err).toBe('');
    expect(code).toBe(0);
    const signedIn = await request(apps[1]!.url, 'POST', '/api/auth/sign-in', { body: { email: 'rowan.pike@college.example', password: 'panel-lamp-test-42' } });
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user.role).toBe('admin');
  });
});
