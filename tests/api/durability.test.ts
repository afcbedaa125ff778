import { rmSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess, type ServerProcess } from './helpers/serverProcess';
import { documentWithRungs } from './helpers/fixtures';

const dataDir = makeTempDataDir();
let proc: ServerProcess | null = null;

afterAll(async () => {
  if (proc) {
    proc.child.kill('SIGKILL');
    await proc.exited;
  }
  rmSync(dataDir, { recursive: true, force: true });
});

async function signInAs(url: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', origin: url }, body: JSON.stringify({ email, password }) });
  expect(res.status).toBe(200);
  return (res.headers.get('set-cookie') ?? '').split(';')[0];
}

function api(url: string, cookie: string) {
  return async (method: string, path: string, body?: unknown) => {
    const res = await fetch(`${url}${path}`, {
      method,
      headers: { 'content-type': 'application/json', origin: url, cookie },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    return { status: res.status, body: (await res.json()) as Record<string, any> } // eslint-disable-line @typescript-eslint/no-explicit-any -- test reads loosely typed JSON;
  };
}

describe('durability of acknowledged saves', () => {
  it('keeps every acknowledged version after the server is killed with SIGKILL and restarted', async () => {
    const [student] = DEMO_STUDENTS;
    proc = await startServerProcess(dataDir);
    let call = api(proc.url, await signInAs(proc.url, student.email, student.password));
    const created = await call('POST', '/api/programs', { title: 'Durable', document: documentWithRungs(1) });
    expect(created.status).toBe(201);
    const id = created.body.program.id as string;

    const acknowledged = new Map<number, unknown>([[1, documentWithRungs(1)]]);
    for (let n = 2; n <= 15; n += 1) {
      const doc = documentWithRungs(n);
      const res = await call('POST', `/api/programs/${id}/versions`, { baseVersion: n - 1, document: doc, message: `v${n}` });
      expect(res.status).toBe(201);
      acknowledged.set(res.body.version.number, doc);
    }
    proc.child.kill('SIGKILL');
    expect(await proc.exited).toBe('SIGKILL');

    proc = await startServerProcess(dataDir);
    call = api(proc.url, await signInAs(proc.url, student.email, student.password));
    const versions = await call('GET', `/api/programs/${id}/versions`);
    expect(versions.body.versions.map((v: { number: number }) => v.number).sort((a: number, b: number) => a - b)).toEqual([...acknowledged.keys()]);
    for (const [number, doc] of acknowledged) {
      const v = await call('GET', `/api/programs/${id}/versions/${number}`);
      expect(v.body.version.document).toEqual(doc);
    }
  }, 120_000);
});
