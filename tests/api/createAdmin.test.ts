/**
 * A real install's first start: the server with `DEMO=off` makes no demo account, and
 * `npm run cli -- create-admin` makes the first administrator, from a piped password or a one-time
 * link, refusing bad input (exit 2) and refusing while a server holds DATA_DIR (exit 1).
 * Real processes on one temporary DATA_DIR, in order; the input checks run in-process.
 */
import { spawn } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createAdmin, type CreateAdminDeps } from '../../server/cli/createAdmin';
import { DEMO_ADMIN, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess, type ServerProcess } from './helpers/serverProcess';
import { createFakeClock } from './helpers/fakeClock';

const dataDir = makeTempDataDir();
const running: ServerProcess[] = [];
const FIRST = { email: 'rowan.pike@college.example', name: 'Rowan Pike', password: 'panel-lamp-test-42' };
const SECOND = { email: 'ines.vale@college.example', name: 'Ines Vale', password: 'overload-trip-class-10' };

afterAll(async () => {
  for (const proc of running) {
    proc.child.kill('SIGKILL');
    await proc.exited;
  }
  rmSync(dataDir, { recursive: true, force: true });
});

/** Runs `npm run cli -- create-admin …` as a real process (`node --import tsx server/cli.ts`). */
function runCli(args: string[], input: string | null): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/cli.ts', 'create-admin', ...args], {
      cwd: path.resolve('.'),
      env: { ...process.env, DATA_DIR: dataDir, LOG_LEVEL: 'warn', NODE_ENV: 'test' },
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (c: Buffer) => (stdout += c.toString()));
    child.stderr.on('data', (c: Buffer) => (stderr += c.toString()));
    child.stdin.end(input ?? '');
    child.on('exit', (code) => resolve({ code, stdout, stderr }));
  });
}

async function signIn(url: string, email: string, password: string): Promise<{ status: number; cookie: string; role?: string }> {
  const res = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', origin: url }, body: JSON.stringify({ email, password }) });
  const body = (await res.json()) as { user?: { role: string } };
  return { status: res.status, cookie: (res.headers.get('set-cookie') ?? '').split(';')[0]!, role: body.user?.role };
}

async function getJson(url: string, cookie: string): Promise<{ status: number; body: Record<string, unknown> }> {
  const res = await fetch(url, { headers: { cookie } });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

async function stop(proc: ServerProcess): Promise<void> {
  proc.child.kill('SIGTERM');
  await proc.exited;
  running.splice(running.indexOf(proc), 1);
}

async function start(env: Record<string, string> = {}): Promise<ServerProcess> {
  const proc = await startServerProcess(dataDir, env);
  running.push(proc);
  return proc;
}

describe('a real first start: DEMO=off, then create-admin', () => {
  it('starts with DEMO=off on an empty DATA_DIR without any demo account, and says how to make the first admin', async () => {
    const server = await start({ DEMO: 'off' });
    expect(server.stdout()).toContain('npm run cli -- create-admin --email');
    for (const demo of [DEMO_ADMIN, DEMO_STUDENTS[0]!]) expect((await signIn(server.url, demo.email, demo.password)).status).toBe(401);
    await stop(server);
  }, 90_000);

  it('creates the first admin from a password piped on standard input', async () => {
    const result = await runCli(['--email', FIRST.email, '--name', FIRST.name], `${FIRST.password}\n`);
    expect(result).toMatchObject({ code: 0, stderr: '' });
    expect(result.stdout).toContain(`Created the administrator ${FIRST.email} (${FIRST.name})`);
  }, 60_000);

  it('refuses an address that already has an account, whatever its case (exit 2)', async () => {
    const result = await runCli(['--email', FIRST.email.toUpperCase()], 'another-good-secret-9\n');
    expect(result.code).toBe(2);
    expect(result.stderr).toContain('already has an account (admin); nothing was created');
  }, 60_000);

  it('lets that admin sign in, and a later default start seeds no demo data into a database that has accounts', async () => {
    const server = await start();
    const admin = await signIn(server.url, FIRST.email, FIRST.password);
    expect(admin).toMatchObject({ status: 200, role: 'admin' });
    expect((await signIn(server.url, DEMO_ADMIN.email, DEMO_ADMIN.password)).status).toBe(401);
    const users = await getJson(`${server.url}/api/admin/users`, admin.cookie);
    expect((users.body.users as { email: string }[]).map((u) => u.email)).toEqual([FIRST.email]);
  }, 90_000);

  it('refuses while the server holds DATA_DIR (exit 1), naming the directory and the server pid', async () => {
    const server = running[0]!;
    const result = await runCli(['--email', SECOND.email, '--link'], null);
    expect(result.code).toBe(1);
    expect(result.stderr).toContain(`Not creating the administrator: DATA_DIR ${path.resolve(dataDir)} is in use by another Rungwright server (pid ${server.pid}`);
    await stop(server);
  }, 60_000);

  it('with --link, prints a one-time link, puts it in the local mailbox, and the link makes an admin', async () => {
    const result = await runCli(['--email', SECOND.email, '--name', SECOND.name, '--link'], null);
    expect(result.code).toBe(0);
    const token = /\/accept-invitation#token=([A-Za-z0-9_-]+)/.exec(result.stdout)?.[1];
    expect(token).toBeDefined();

    const server = await start();
    const accepted = await fetch(`${server.url}/api/auth/invitations/accept`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: server.url },
      body: JSON.stringify({ token, name: SECOND.name, password: SECOND.password }),
    });
    expect(accepted.status).toBeLessThan(300);
    expect((await signIn(server.url, SECOND.email, SECOND.password)).role).toBe('admin');

    const first = await signIn(server.url, FIRST.email, FIRST.password);
    const mail = (await getJson(`${server.url}/api/dev/mail`, first.cookie)).body.mail as { to: string; text: string }[];
    expect(mail.filter((m) => m.to.includes(SECOND.email)).map((m) => m.text.includes(`#token=${token}`))).toEqual([true]);
    await stop(server);
  }, 120_000);
});

describe('create-admin input checks (before the database is opened)', () => {
  const untouched = path.join(dataDir, 'never-opened');

  function deps(stdin: string | null): CreateAdminDeps & { out: () => string; err: () => string } {
    let out = '';
    let err = '';
    return {
      env: { DATA_DIR: untouched },
      readStdin: async () => stdin,
      stdout: (t) => void (out += t),
      stderr: (t) => void (err += t),
      clock: createFakeClock(),
      out: () => out,
      err: () => err,
    };
  }

  it.each([
    [[], 'create-admin needs --email E'],
    [['--email'], "Option '--email <value>' argument missing"],
    [['--email', 'not-an-address'], '--email "not-an-address": not a valid e-mail address'],
    [['--email', 'a@college.example', '--name', '   '], '--name: a name is needed'],
    [['--email', 'a@college.example', '--role', 'admin'], "Unknown option '--role'"],
    [['--email', 'a@college.example', 'extra'], 'Unexpected argument'],
  ])('refuses the arguments %j with exit 2 and says what is wrong', async (argv, message) => {
    const d = deps('good-enough-secret-1');
    expect(await createAdmin(argv, d)).toBe(2);
    expect(d.err()).toContain(message);
    expect(existsSync(untouched)).toBe(false);
  });

  it.each([
    ['short9', 'a password needs at least 10 characters'],
    [DEMO_ADMIN.password, 'it is one of the demo passwords printed in the README'],
    ['Pike.rowan-2026!', 'it contains the name part of the e-mail address'],
    ['abababababab', 'it has fewer than 5 different characters'],
    ['1234567890', 'it is a run of keys or letters (like "1234567890" or "qwertyuiop")'],
    ['poiuytrewq', 'it is a run of keys or letters (like "1234567890" or "qwertyuiop")'],
  ])('refuses the weak password %j with exit 2, creating nothing', async (password, reason) => {
    const d = deps(`${password}\n`);
    expect(await createAdmin(['--email', 'pike@college.example'], d)).toBe(2);
    expect(d.err()).toBe(`The password is too weak: ${reason}. Nothing was created.\n`);
    expect(existsSync(untouched)).toBe(false);
  });

  it('asks for a piped password when standard input is a terminal, and refuses several lines', async () => {
    const terminal = deps(null);
    expect(await createAdmin(['--email', 'a@college.example'], terminal)).toBe(2);
    expect(terminal.err()).toContain('reads the password from standard input');
    expect(terminal.err()).toContain('--link');
    const twoLines = deps('first-line-secret\nsecond-line\n');
    expect(await createAdmin(['--email', 'a@college.example'], twoLines)).toBe(2);
    expect(twoLines.err()).toContain('more than one line');
    expect(existsSync(untouched)).toBe(false);
  });

  it('prints its usage with --help (exit 0)', async () => {
    const d = deps(null);
    expect(await createAdmin(['--help'], d)).toBe(0);
    expect(d.out()).toContain("printf '%s' \"$PASSWORD\" | npm run cli -- create-admin --email E");
  });
});
