/**
 * Malformed requests to every route, in-process, as every kind of caller: none may answer 5xx or
 * hang. The routes are read from the app's own router stack (`listRoutes`), so a new route is
 * fuzzed without being listed; `VALID_BODIES` gives each route that takes a body a valid one to
 * spoil, and the first test fails when a route has none (the table is kept in sync by that test).
 *
 * The requests are drawn with fast-check from a fixed seed (`FUZZ_SEED` picks another,
 * `FUZZ_REQUESTS` another count) and sent
 * four at a time; the statuses seen are counted and printed, and every 5xx or timeout is listed.
 * The fake clock moves on 5 minutes every 250 requests, so the per-user limits on expensive calls
 * reset and the routes behind them keep being reached.
 */
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Express } from 'express';
import { FORWARD_REVERSE, THREE_WIRE } from '@shared/labs';
import { listRoutes, type RouteEntry } from '../../server/http/routeList';
import { createTestApp, type TestApp } from './helpers/testApp';
import { addUser, call, createCast, createProgramAs, documentWithRungs, PASSWORD, signIn, type Cast } from './helpers/fixtures';
import { enrol } from '../../server/db/classes';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';
import { requestsFor, type BodyTemplate, type FuzzBody, type FuzzRequest, type IdPool } from './fuzzRequests';

/** Requests sent in the main run (the bad-cookie run adds its own); `FUZZ_REQUESTS` sets another count. */
const REQUESTS = Number(process.env.FUZZ_REQUESTS ?? 5200);
const CONCURRENCY = 4;
/** A request that has not answered by then counts as a hang. */
const REQUEST_DEADLINE_MS = 15_000;
const SEED = Number(process.env.FUZZ_SEED ?? 20_261_205);

const keepAlive = new http.Agent({ keepAlive: true, maxSockets: 8 });
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(32)]);

let t: TestApp;
let cast: Cast;
let routes: RouteEntry[];
/** Real ids for paths; DELETE routes get throwaway ones, so the fixtures the rest need survive. */
let ids: IdPool;
let throwaway: IdPool;
/** A session of an account no other request uses: "sign out everywhere" ends it, not a caller's. */
let leaverCookie: string;
let templates: Record<string, BodyTemplate | 'multipart'>;

async function uploadAttachment(labId: string): Promise<string> {
  const res = await call(t, 'post', `/api/labs/${labId}/attachments`, cast.instructor.cookie).attach('file', PNG, { filename: 'wiring.png', contentType: 'image/png' });
  expect(res.status, res.text).toBe(201);
  return res.body.attachment.id as string;
}

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  routes = uniqueRoutes(listRoutes(t.server.listeners('request')[0] as Express));
  const { labId, solutionId } = await labFromTemplate(t, cast.instructor, cast.classId, FORWARD_REVERSE.id);
  await publish(t, cast.instructor, labId);
  const ref = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution);
  const submitted = await submitVersion(t, cast.studentA, labId, ref);
  expect(submitted.status, submitted.text).toBe(201);
  const attachmentId = await uploadAttachment(labId);
  const spare = await labFromTemplate(t, cast.instructor, cast.classId, THREE_WIRE.id);
  const spareAttachment = await uploadAttachment(spare.labId);
  const spareProgram = await createProgramAs(t, cast.studentB, 'Spare');
  const leaver = await addUser(t, 'leaver@test.example', 'student');
  const invited = await call(t, 'post', `/api/classes/${cast.classId}/invitations`, cast.instructor.cookie).send({ email: 'fuzz.invited@test.example', name: 'Fuzz Invited' });
  expect(invited.status, invited.text).toBe(201);
  const invitationId = ((await call(t, 'get', '/api/admin/invitations', cast.admin.cookie)).body.invitations as { id: string; email: string }[]).find((i) => i.email === 'fuzz.invited@test.example')!.id;
  await enrol(t.database.orm, cast.otherClassId, leaver.id, t.clock.now());
  const bystander = await addUser(t, 'bystander@test.example', 'student');
  leaverCookie = await signIn(t, bystander.email);
  ids = {
    'programs:id': [solutionId, ref.programId],
    number: ['1', String(ref.version)],
    'classes:id': [cast.classId, cast.otherClassId],
    'labs:id': [labId],
    'submissions:id': [submitted.body.submission.id as string],
    attachmentId: [attachmentId],
    userId: [cast.studentB.user.id],
    // Admin actions on an account (deactivate, reset link) act on a spare one, not on a caller.
    'users:id': [leaver.id],
    'invitations:id': [invitationId],
  };
  throwaway = { ...ids, 'programs:id': [spareProgram], 'labs:id': [spare.labId], attachmentId: [spareAttachment], 'classes:id': [cast.otherClassId], userId: [leaver.id] };
  const version = { programId: ref.programId, version: ref.version };
  templates = {
    'POST /api/auth/sign-in': { email: 'student.a@test.example', password: PASSWORD },
    'POST /api/auth/sign-up': { email: 'new.student@test.example', name: 'New Student', password: 'a-long-enough-password', joinCode: 'TEST-CODE' },
    'POST /api/auth/sign-out': {},
    'POST /api/auth/password-reset': { email: 'student.b@test.example' },
    'POST /api/auth/password-reset/confirm': { token: 'x'.repeat(43), password: 'a-long-enough-password' },
    'POST /api/auth/invitations/lookup': { token: 'x'.repeat(43) },
    'POST /api/auth/invitations/accept': { token: 'x'.repeat(43), name: 'Invited', password: 'a-long-enough-password' },
    // Ends the caller's sessions when it succeeds: later cases of that caller then fuzz as a stranger.
    'POST /api/auth/sign-out-everywhere': {},
    // A wrong current password: valid in shape, changes nothing.
    'POST /api/auth/password': { currentPassword: 'not-the-password', newPassword: 'a-long-enough-password' },
    'POST /api/auth/sign-up/lookup': { token: 'x'.repeat(43) },
    'POST /api/auth/sign-up/finish': { token: 'x'.repeat(43), name: 'New Student', password: 'a-long-enough-password' },
    'POST /api/auth/invitations/join': { token: 'x'.repeat(43) },
    'POST /api/classes/:id/invitations': { email: 'hand.added@test.example', name: 'Hand Added' },
    'POST /api/admin/users/:id/deactivate': {},
    'POST /api/admin/users/:id/reactivate': {},
    'POST /api/admin/users/:id/password-reset': {},
    'POST /api/admin/instructor-invitations': { email: 'new.teacher@test.example', name: 'New Teacher' },
    'POST /api/programs': { title: 'Fuzzed', document: documentWithRungs(2), labId },
    'PATCH /api/programs/:id': { title: 'Renamed' },
    'POST /api/programs/:id/versions': { baseVersion: 1, document: documentWithRungs(1), message: 'fuzz' },
    'PUT /api/programs/:id/draft': { baseVersion: 1, document: documentWithRungs(1) },
    'PUT /api/programs/:id/proof': {
      properties: [{ never: { '%QX1': true, '%QX2': true } }, { after: { S1: 'pressed' }, within: 100, expect: { K1: 'closed' } }],
      checks: [{ label: 'fuzz', script: { panel: 'reversing-conveyor', scanMs: 10, settleMs: 0, steps: [{ press: 'S1' }, { wait: 10 }, { expect: { K1: 'closed' } }] } }],
    },
    'POST /api/programs/:id/restore': { version: 1, baseVersion: 1 },
    'POST /api/programs/import': 'multipart',
    'POST /api/classes': { name: 'Fuzz class', term: 'Fall 2026' },
    'POST /api/classes/join': { joinCode: 'TEST-CODE' },
    'POST /api/classes/:id/join-code': {},
    'POST /api/classes/:id/roster': 'multipart',
    'POST /api/classes/:id/labs': {
      title: 'Fuzz lab',
      script: FORWARD_REVERSE.script,
      totalPoints: 10,
      dueAt: '2026-10-01T00:00:00Z',
      latePolicy: { kind: 'penalty', penaltyPercent: 10 },
      starter: { kind: 'program', programId: solutionId, version: 1 },
      panel: { kind: 'builtIn', id: 'reversing-conveyor' },
    },
    'POST /api/classes/:id/labs/from-template': { templateId: THREE_WIRE.id, totalPoints: 5 },
    'PATCH /api/labs/:id': { title: 'Renamed lab', totalPoints: 20, dueAt: null },
    'POST /api/labs/:id/publish': {},
    'POST /api/labs/:id/unpublish': {},
    'POST /api/labs/:id/try': version,
    'POST /api/labs/:id/open': {},
    'POST /api/labs/:id/submissions': version,
    'POST /api/labs/:id/regrade': {},
    'POST /api/labs/:id/attachments': 'multipart',
    'POST /api/submissions/:id/override': { score: 5, reason: 'fuzz' },
    'PUT /api/submissions/:id/feedback': { feedback: 'fine' },
    'POST /api/submissions/:id/return': { feedback: 'fine' },
    'POST /api/admin/users/:id/role': { role: 'student' },
    'POST /api/labs/:id/return-graded': { note: 'fine' },
    'POST /api/invitations/:id/resend': {},
    'POST /api/invitations/:id/cancel': {},
  };
}, 120_000);
afterAll(async () => {
  keepAlive.destroy();
  await t?.close();
});

function uniqueRoutes(list: RouteEntry[]): RouteEntry[] {
  const seen = new Map<string, RouteEntry>();
  for (const route of list) seen.set(`${route.method} ${route.path}`, route);
  return [...seen.values()];
}

const key = (route: RouteEntry): string => `${route.method} ${route.path}`;
const takesBody = (route: RouteEntry): boolean => route.method !== 'GET' && route.method !== 'DELETE';

/** One caller per role, a stranger (no cookie) last. */
function cookies(): (string | null)[] {
  return [cast.admin.cookie, cast.instructor.cookie, cast.otherInstructor.cookie, cast.studentA.cookie, cast.studentB.cookie, null];
}

interface Outcome {
  status: number | 'timeout' | 'client error';
  request: FuzzRequest;
  detail: string;
}

function describeBody(body: FuzzBody): string {
  return body.kind === 'none' ? 'no body' : body.label;
}

/** The bytes and headers of a body, exactly as they go on the wire. */
function encode(body: FuzzBody): { headers: Record<string, string>; bytes: Buffer | null } {
  switch (body.kind) {
    case 'none':
      return { headers: {}, bytes: null };
    case 'json': {
      let text: string;
      try {
        text = JSON.stringify(body.value) ?? 'null';
      } catch {
        text = '"unserialisable"';
      }
      return { headers: { 'content-type': 'application/json' }, bytes: Buffer.from(text) };
    }
    case 'raw':
      return { headers: { ...(body.contentType ? { 'content-type': body.contentType } : {}), ...(body.encoding ? { 'content-encoding': body.encoding } : {}) }, bytes: body.bytes };
    case 'multipart':
      return { headers: { 'content-type': body.contentType, ...(body.label.includes('gzip') ? { 'content-encoding': 'gzip' } : {}) }, bytes: body.bytes };
  }
}

/**
 * Sends one request with `node:http`, which puts the path and the body on the wire as given
 * (supertest turns a Buffer sent as JSON into JSON, and fetch tidies paths).
 */
function send(request: FuzzRequest, cookie: string | null): Promise<Outcome> {
  const { headers, bytes } = encode(request.body);
  const target = new URL(t.origin);
  return new Promise((resolve) => {
    let req: http.ClientRequest;
    try {
      req = http.request({
        host: target.hostname,
        port: target.port,
        method: request.method,
        path: `${request.path}${request.query ? `?${request.query}` : ''}`,
        headers: { origin: t.origin, ...(cookie ? { cookie } : {}), ...headers, ...(bytes ? { 'content-length': String(bytes.length) } : {}) },
        agent: keepAlive,
      });
    } catch (err) {
      resolve({ status: 'client error', request, detail: err instanceof Error ? err.message : String(err) });
      return;
    }
    const timer = setTimeout(() => {
      req.destroy();
      resolve({ status: 'timeout', request, detail: `no answer within ${REQUEST_DEADLINE_MS} ms` });
    }, REQUEST_DEADLINE_MS);
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => {
        clearTimeout(timer);
        const status = res.statusCode ?? 0;
        resolve({ status, request, detail: status >= 500 ? Buffer.concat(chunks).toString('utf8').slice(0, 300) : '' });
      });
    });
    req.on('error', (err) => {
      clearTimeout(timer);
      resolve({ status: 'client error', request, detail: err.message });
    });
    req.end(bytes ?? undefined);
  });
}

/** Sends `requests` `CONCURRENCY` at a time, moving the clock on every 250, and returns every outcome. */
async function run(requests: readonly FuzzRequest[], cookieOf: (request: FuzzRequest) => string | null): Promise<Outcome[]> {
  const outcomes: Outcome[] = [];
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < requests.length) {
      const index = next++;
      if (index > 0 && index % 250 === 0) t.clock.advance(5 * 60 * 1000 + 1000);
      outcomes.push(await send(requests[index]!, cookieOf(requests[index]!)));
    }
  };
  await Promise.all(Array.from({ length: CONCURRENCY }, worker));
  return outcomes;
}

function tally(outcomes: readonly Outcome[]): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const o of outcomes) counts[String(o.status)] = (counts[String(o.status)] ?? 0) + 1;
  return Object.fromEntries(Object.entries(counts).sort(([a], [b]) => a.localeCompare(b)));
}

function failures(outcomes: readonly Outcome[]): string[] {
  return outcomes
    .filter((o) => typeof o.status !== 'number' || o.status >= 500)
    .map((o) => `${o.status} ${o.request.method} ${o.request.path.slice(0, 120)}${o.request.query ? `?${o.request.query.slice(0, 60)}` : ''} as #${o.request.who} with ${describeBody(o.request.body)}: ${o.detail}`);
}

/** Draws the requests: an equal share per route, each route from its own seed. */
function draw(total: number, callers: number): FuzzRequest[] {
  const perRoute = Math.ceil(total / routes.length);
  return routes.flatMap((route, i) => {
    const template = takesBody(route) ? (templates[key(route)] ?? null) : null;
    const pool = route.method === 'DELETE' ? throwaway : ids;
    return fc.sample(requestsFor(route, template, pool, callers), { numRuns: perRoute, seed: SEED + i });
  });
}

describe('the fuzz test', () => {
  it('reaches every route, and has a valid body for each route that takes one', () => {
    expect(routes.map(key)).toEqual(expect.arrayContaining(['GET /api/health', 'GET /api/programs/:id/versions/:number/export', 'POST /api/programs/import', 'PUT /api/submissions/:id/feedback']));
    const withBody = routes.filter(takesBody).map(key);
    expect(withBody.filter((k) => !(k in templates)), 'routes without a valid body in the table').toEqual([]);
    expect(Object.keys(templates).filter((k) => !withBody.includes(k)), 'table entries for routes that no longer exist').toEqual([]);
  });

  it(`answers ${REQUESTS} malformed requests to every route, as every role and a stranger, with no 5xx and no hang`, async () => {
    const callers = cookies();
    const requests = draw(REQUESTS, callers.length);
    const started = Date.now();
    // Signing out would end the caller's session for the rest of the run: only strangers do, and
    // "sign out everywhere" ends a bystander's sessions (its first call does; the rest are 401).
    const cookieOf = (r: FuzzRequest): string | null => (r.path === '/api/auth/sign-out' ? null : r.path === '/api/auth/sign-out-everywhere' ? leaverCookie : callers[r.who]!);
    const outcomes = await run(requests, cookieOf);
    const signedOutCallers = await Promise.all(callers.filter((c): c is string => c !== null).map(async (c) => (await call(t, 'get', '/api/me', c)).status));
    expect(signedOutCallers, 'every caller is still signed in after the run').toEqual(callers.filter((c) => c !== null).map(() => 200));
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    console.log(`fuzz: ${outcomes.length} requests over ${routes.length} routes in ${seconds} s (seed ${SEED}); statuses ${JSON.stringify(tally(outcomes))}`);
    expect(outcomes.length).toBeGreaterThanOrEqual(5000);
    expect(failures(outcomes)).toEqual([]);
  }, 240_000);

  // The session cookie is read by `server/auth/session.ts` (the sessions work): a cookie that is
  // not valid %-encoding must be a signed-out caller or a 4xx, never a 500.
  it('answers requests carrying a malformed session cookie with no 5xx (session cookie part)', async () => {
    const badCookies = ['rw_session=%E0%A4%A', 'rw_session=%', 'rw_session=%zz%00', `rw_session=${'a'.repeat(5000)}`, 'rw_session="unterminated', 'rw_session=a; rw_session=%FF', 'rw_session=eyJhbGciOiJub25lIn0.e30.'];
    const requests = draw(routes.length * 6, badCookies.length);
    const outcomes = await run(requests, (r) => badCookies[r.who]!);
    console.log(`fuzz (malformed session cookie): ${outcomes.length} requests; statuses ${JSON.stringify(tally(outcomes))}`);
    expect(failures(outcomes)).toEqual([]);
  }, 120_000);
});
