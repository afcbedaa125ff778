/**
 * Two transport rules in front of every route: a request whose Host is not one of the server's
 * names is refused (421) before anything runs, on the API and the single-page app alike (against
 * DNS rebinding on a local install); and API answers are never stored by a cache, while the built
 * client's hashed files are kept for a year.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiErrorBodySchema } from '@shared/api/errors';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, person, type Person } from './helpers/fixtures';

const dist = mkdtempSync(path.join(tmpdir(), 'rungwright-dist-'));
mkdirSync(path.join(dist, 'assets'));
writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Rungwright</title>');
writeFileSync(path.join(dist, 'assets', 'index-C38fXH4l.js'), 'export {};');

let t: TestApp;
let student: Person;
let port: string;
beforeAll(async () => {
  t = await createTestApp({}, { clientDir: dist });
  student = await person(t, 'student@test.example', 'student');
  port = new URL(t.origin).port;
});
afterAll(async () => {
  await t.close();
  rmSync(dist, { recursive: true, force: true });
});

/** Sends a raw HTTP/1.0 request (which may lack a Host header) and returns the status line and body. */
function rawRequest(port: number, lines: string[]): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(port, '127.0.0.1', () => socket.end(`${lines.join('\r\n')}\r\n\r\n`));
    let text = '';
    socket.on('data', (chunk) => (text += chunk.toString()));
    socket.on('end', () => resolve(text));
    socket.on('error', reject);
  });
}

describe('the Host check', () => {
  const foreignHosts = ['attacker.example', 'attacker.example:80', '127.0.0.1.nip.example', 'localhost.attacker.example', 'user@localhost', 'localhost/evil', '0.0.0.0'];
  const everyKindOfPath: [string, string][] = [
    ['GET', '/api/health'],
    ['GET', '/api/me'],
    ['GET', '/api/programs'],
    ['POST', '/api/auth/sign-in'],
    ['GET', '/'],
    ['GET', '/programs'],
    ['GET', '/assets/index-C38fXH4l.js'],
  ];

  it.each(everyKindOfPath)('refuses %s %s with 421 and a clear message when Host is a foreign name', async (method, url) => {
    for (const host of foreignHosts) {
      const req = method === 'GET' ? t.http.get(url) : t.http.post(url).send({ email: student.user.email, password: 'x' });
      const res = await req.set('Host', host).set('Origin', `http://${host}`).set('Cookie', student.cookie);
      expect([host, res.status]).toEqual([host, 421]);
      expect(ApiErrorBodySchema.parse(res.body).error.code).toBe('unknown_host');
      expect(res.body.error.message).toContain('ALLOWED_HOSTS');
      expect(res.headers['cache-control']).toBe('no-store');
      expect(res.text).not.toContain('<title>Rungwright</title>');
    }
  });

  it('answers the loopback names on any port, in any case', async () => {
    for (const host of [`127.0.0.1:${port}`, '127.0.0.1', 'localhost:5173', 'LocalHost', 'localhost.', `[::1]:${port}`]) {
      const res = await t.http.get('/api/health').set('Host', host);
      expect([host, res.status]).toEqual([host, 200]);
    }
  });

  it('refuses a request without any Host header', async () => {
    const answer = await rawRequest(Number(port), ['GET /api/health HTTP/1.0']);
    expect(answer).toMatch(/^HTTP\/1\.1 421 /);
    expect(answer).toContain('no Host header');
  });

  it('runs nothing for a refused request: a sign-in with a foreign Host does not sign in', async () => {
    const res = await t.http.post('/api/auth/sign-in').set('Host', 'attacker.example').set('Origin', 'http://attacker.example').send({ email: student.user.email, password: 'correct-horse-battery' });
    expect(res.status).toBe(421);
    expect(res.headers['set-cookie']).toBeUndefined();
  });
});

describe('the Host check, configured', () => {
  let configured: TestApp;
  beforeAll(async () => {
    configured = await createTestApp({
      ALLOWED_HOSTS: 'rungwright.college.example, lab-pc-12:3000 ,',
      PUBLIC_URL: 'https://grades.college.example/',
      HOST: '192.168.40.7',
    });
  });
  afterAll(async () => {
    await configured.close();
  });

  it('answers the names in ALLOWED_HOSTS, PUBLIC_URL and HOST, and still the loopback names', async () => {
    for (const host of ['rungwright.college.example', 'RUNGWRIGHT.college.example:8443', 'lab-pc-12', 'lab-pc-12:3000', 'grades.college.example', '192.168.40.7:3000', 'localhost:3000']) {
      const res = await configured.http.get('/api/health').set('Host', host);
      expect([host, res.status]).toEqual([host, 200]);
    }
  });

  it('refuses every other name', async () => {
    for (const host of ['college.example', 'other.college.example', '192.168.40.8', 'attacker.example']) {
      const res = await configured.http.get('/api/health').set('Host', host);
      expect([host, res.status]).toEqual([host, 421]);
    }
  });

  it('does not take the wildcard listen address for a name: HOST=0.0.0.0 allows only the loopback names', async () => {
    const wildcard = await createTestApp({ HOST: '0.0.0.0' });
    try {
      expect((await wildcard.http.get('/api/health').set('Host', '0.0.0.0:3000')).status).toBe(421);
      expect((await wildcard.http.get('/api/health').set('Host', '10.0.0.5:3000')).status).toBe(421);
      expect((await wildcard.http.get('/api/health').set('Host', 'localhost:3000')).status).toBe(200);
    } finally {
      await wildcard.close();
    }
  });
});

describe('the Origin check beside the Host check', () => {
  it('accepts a state-changing request whose Origin is the Host under another spelling of case', async () => {
    const res = await t.http.post('/api/nope').set('Host', `LOCALHOST:${port}`).set('Origin', `http://localhost:${port}`).send({});
    expect(res.status).toBe(404);
  });

  it('refuses one whose Origin is an allowed name but another port', async () => {
    const res = await t.http.post('/api/nope').set('Host', `localhost:${port}`).set('Origin', 'http://localhost:5999').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
    expect(res.body.error.message).toBe(`Cross-site request refused: origin localhost:5999 is not localhost:${port}`);
  });
});

describe('Cache-Control', () => {
  it('is no-store on answers that depend on who asks', async () => {
    for (const url of ['/api/me', '/api/programs', '/api/classes']) {
      const res = await call(t, 'get', url, student.cookie);
      expect([url, res.status, res.headers['cache-control']]).toEqual([url, 200, 'no-store']);
    }
  });

  it('is no-store on refusals and errors under /api, signed out too', async () => {
    const signedOut = await call(t, 'get', '/api/programs');
    expect([signedOut.status, signedOut.headers['cache-control']]).toEqual([401, 'no-store']);
    const missing = await call(t, 'get', '/api/nope', student.cookie);
    expect([missing.status, missing.headers['cache-control']]).toEqual([404, 'no-store']);
    const signIn = await call(t, 'post', '/api/auth/sign-in').send({ email: student.user.email, password: 'correct-horse-battery' });
    expect([signIn.status, signIn.headers['cache-control']]).toEqual([200, 'no-store']);
  });

  it('is no-store on /api/health, which must report the present state to every probe', async () => {
    expect((await t.http.get('/api/health')).headers['cache-control']).toBe('no-store');
  });

  it('keeps the built client cacheable: hashed assets for a year, the page revalidated', async () => {
    expect((await t.http.get('/assets/index-C38fXH4l.js')).headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const page = await t.http.get('/programs');
    expect([page.status, page.headers['cache-control']]).toEqual([200, 'no-cache']);
  });
});
