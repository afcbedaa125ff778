/**
 * `npm run cli -- export-db --to postgres://…`: the embedded database of a DATA_DIR copied into an
 * empty PostgreSQL database, every table checked row for row, and a server started on the copy
 * signs in the same accounts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { exportDb, tablesInCopyOrder } from '../../../server/cli/exportDb';
import { openDatabase } from '../../../server/db/client';
import { seedDemoData } from '../../../server/db/seed';
import { programs } from '../../../server/db/schema';
import { upsertProofSheet } from '../../../server/db/proofSheets';
import { DEMO_STUDENTS } from '../../../server/db/demoAccounts';
import { systemClock } from '../../../server/clock';
import { makeTempDataDir } from '../helpers/serverProcess';
import { TEST_SCRYPT } from '../helpers/testApp';
import { databaseUrl } from '../helpers/postgresDatabases';
import { request, sharedEnv, startApp, stopProcess } from '../helpers/postgresProcesses';

let dataDir: string;
let targetUrl: string;
const targetName = `rw_export_${randomBytes(4).toString('hex')}`;

async function onAdmin(statement: string): Promise<void> {
  const client = new pg.Client({ connectionString: inject('pgAdminUrl') });
  await client.connect();
  await client.query(statement);
  await client.end();
}

function run(argv: string[], env: Record<string, string> = {}) {
  let out = '';
  let err = '';
  return exportDb(argv, { env: { DATA_DIR: dataDir, ...env }, stdout: (t) => (out += t), stderr: (t) => (err += t), clock: systemClock }).then((code) => ({ code, out, err }));
}

beforeAll(async () => {
  dataDir = makeTempDataDir();
  const source = await openDatabase({ kind: 'directory', dataDir });
  await seedDemoData(source.orm, systemClock, TEST_SCRYPT);
  // A proof sheet (json columns), whose condition keys must arrive in the order they were written.
  const [program] = await source.orm.select().from(programs).limit(1);
  await upsertProofSheet(source.orm, { programId: program!.id, userId: program!.ownerId, properties: [{ never: { K2: 'closed', K1: 'closed' } }], checks: [], now: systemClock.now() });
  await source.close();
  await onAdmin(`create database ${targetName}`);
  targetUrl = databaseUrl(inject('pgAdminUrl'), targetName);
}, 60_000);

afterAll(async () => {
  await onAdmin(`drop database if exists ${targetName} with (force)`);
  rmSync(dataDir, { recursive: true, force: true });
});

describe('export-db', () => {
  it('orders the tables so that each comes after the tables it references', () => {
    const names = tablesInCopyOrder().map((t) => (t as unknown as { [k: symbol]: string })[Symbol.for('drizzle:Name')]);
    expect(names.indexOf('users')).toBeLessThan(names.indexOf('programs'));
    expect(names.indexOf('programs')).toBeLessThan(names.indexOf('program_versions'));
    expect(names.indexOf('labs')).toBeLessThan(names.indexOf('submissions'));
    expect(new Set(names).size).toBe(names.length);
  });

  it('refuses a target that is not a PostgreSQL URL, naming the option (exit 2)', async () => {
    const result = await run(['--to', 'mysql://x']);
    expect(result.code).toBe(2);
    expect(result.err).toContain('--to must be a postgres://');
  });

  it('copies every table into an empty database and checks it row for row', async () => {
    const result = await run(['--to', targetUrl]);
    expect(result.err).toBe('');
    expect(result.code).toBe(0);
    expect(result.out).toMatch(/copied users: \d+ rows/);
    expect(result.out).toContain('the copy matches');
    const client = new pg.Client({ connectionString: targetUrl });
    await client.connect();
    const { rows } = await client.query<{ n: number }>('select count(*)::int as n from users');
    const sheets = await client.query<{ properties: string }>('select properties::text as properties from proof_sheets');
    await client.end();
    expect(rows[0]!.n).toBe(DEMO_STUDENTS.length + 2);
    expect(result.out).toContain('copied proof_sheets: 1 rows');
    expect(sheets.rows.map((r) => r.properties)).toEqual(['[{"never":{"K2":"closed","K1":"closed"}}]']);
  });

  it('refuses to copy into a database that already has rows (exit 1), changing nothing', async () => {
    const result = await run(['--to', targetUrl]);
    expect(result.code).toBe(1);
    expect(result.err).toContain('the target database is not empty');
  });

  it('serves the copied accounts from a server started on the copy', async () => {
    const app = await startApp(sharedEnv(targetUrl));
    try {
      const student = DEMO_STUDENTS[0]!;
      const res = await request(app.url, 'POST', '/api/auth/sign-in', { body: { email: student.email, password: student.password } });
      expect(res.status).toBe(200);
      expect(res.body.user.email).toBe(student.email);
    } finally {
      await stopProcess(app);
    }
  });
});
