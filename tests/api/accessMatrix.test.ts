/**
 * The access-control matrix: every route × every kind of caller, in one table. To add a route, add
 * one row. The program under test belongs to student A; the class is taught by `instructor`, and
 * students A and B are in it; `otherInstructor` teaches another class.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Test } from 'supertest';
import { exportPlcopen } from '@shared/ladder/plcopen';
import { THREE_WIRE_DEMO } from '../../server/db/demoPrograms';
import { enrol } from '../../server/db/classes';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, documentWithRungs, type Cast } from './helpers/fixtures';

const ACTORS = ['anonymous', 'studentA', 'studentB', 'instructor', 'otherInstructor', 'admin'] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;

/** What a request needs: a fresh program of student A, the class id, a counter for unique values. */
interface Scene {
  programId: string;
  classId: string;
  cast: Cast;
  n: number;
}

interface Row {
  route: string;
  send: (t: TestApp, cookie: string | null, s: Scene) => Test;
  expect: Expected;
}

const all = (status: number): Expected => ({ anonymous: 401, studentA: status, studentB: status, instructor: status, otherInstructor: status, admin: status });
/** Read a program of student A: the owner, their instructor and admins; others must not learn it exists. */
const readA = (ok: number): Expected => ({ anonymous: 401, studentA: ok, studentB: 404, instructor: ok, otherInstructor: 404, admin: ok });
/** Change a program of student A: the instructor may see it, not change it. */
const writeA = (ok: number): Expected => ({ anonymous: 401, studentA: ok, studentB: 404, instructor: 403, otherInstructor: 404, admin: ok });
/** Manage the class: its instructor and admins; enrolled students know it exists (403). */
const manage = (ok: number): Expected => ({ anonymous: 401, studentA: 403, studentB: 403, instructor: ok, otherInstructor: 404, admin: ok });
const adminOnly = (ok: number): Expected => ({ anonymous: 401, studentA: 403, studentB: 403, instructor: 403, otherInstructor: 403, admin: ok });

const xml = exportPlcopen(THREE_WIRE_DEMO);

const ROWS: Row[] = [
  { route: 'GET /api/health', send: (t) => call(t, 'get', '/api/health'), expect: { ...all(200), anonymous: 200 } },
  { route: 'GET /api/me', send: (t, c) => call(t, 'get', '/api/me', c), expect: all(200) },
  { route: 'POST /api/auth/sign-out', send: (t, c) => call(t, 'post', '/api/auth/sign-out', c).send({}), expect: { ...all(204), anonymous: 204 } },
  { route: 'GET /api/programs', send: (t, c) => call(t, 'get', '/api/programs', c), expect: all(200) },
  { route: 'GET /api/programs?ownerId=A', send: (t, c, s) => call(t, 'get', `/api/programs?ownerId=${s.cast.studentA.user.id}`, c), expect: readA(200) },
  { route: 'POST /api/programs', send: (t, c) => call(t, 'post', '/api/programs', c).send({ title: 'Mine' }), expect: all(201) },
  { route: 'GET /api/programs/:id', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}`, c), expect: readA(200) },
  { route: 'PATCH /api/programs/:id', send: (t, c, s) => call(t, 'patch', `/api/programs/${s.programId}`, c).send({ title: 'Renamed' }), expect: writeA(200) },
  { route: 'DELETE /api/programs/:id', send: (t, c, s) => call(t, 'delete', `/api/programs/${s.programId}`, c), expect: writeA(204) },
  { route: 'GET /api/programs/:id/versions', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}/versions`, c), expect: readA(200) },
  {
    route: 'POST /api/programs/:id/versions',
    send: (t, c, s) => call(t, 'post', `/api/programs/${s.programId}/versions`, c).send({ baseVersion: 1, document: documentWithRungs(2) }),
    expect: writeA(201),
  },
  { route: 'GET /api/programs/:id/versions/:n', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}/versions/1`, c), expect: readA(200) },
  { route: 'GET /api/programs/:id/versions/:n/export', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}/versions/1/export?format=plcopen`, c), expect: readA(200) },
  { route: 'GET /api/programs/:id/diff', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}/diff?from=1&to=1`, c), expect: readA(200) },
  { route: 'POST /api/programs/:id/restore', send: (t, c, s) => call(t, 'post', `/api/programs/${s.programId}/restore`, c).send({ version: 1, baseVersion: 1 }), expect: writeA(201) },
  {
    route: 'POST /api/programs/import',
    send: (t, c) => call(t, 'post', '/api/programs/import', c).attach('file', Buffer.from(xml), { filename: 'p.xml', contentType: 'application/xml' }),
    expect: all(201),
  },
  { route: 'GET /api/classes', send: (t, c) => call(t, 'get', '/api/classes', c), expect: all(200) },
  {
    route: 'POST /api/classes',
    send: (t, c) => call(t, 'post', '/api/classes', c).send({ name: 'New class', term: 'Spring' }),
    expect: { anonymous: 401, studentA: 403, studentB: 403, instructor: 201, otherInstructor: 201, admin: 201 },
  },
  {
    route: 'POST /api/classes/join',
    send: (t, c) => call(t, 'post', '/api/classes/join', c).send({ joinCode: 'OTHR-CODE' }),
    expect: { anonymous: 401, studentA: 200, studentB: 200, instructor: 403, otherInstructor: 403, admin: 403 },
  },
  {
    route: 'GET /api/classes/:id',
    send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}`, c),
    expect: { anonymous: 401, studentA: 200, studentB: 200, instructor: 200, otherInstructor: 404, admin: 200 },
  },
  { route: 'POST /api/classes/:id/join-code', send: (t, c, s) => call(t, 'post', `/api/classes/${s.classId}/join-code`, c).send({}), expect: manage(200) },
  { route: 'GET /api/classes/:id/students', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}/students`, c), expect: manage(200) },
  { route: 'DELETE /api/classes/:id/students/:userId', send: (t, c, s) => call(t, 'delete', `/api/classes/${s.classId}/students/${s.cast.studentB.user.id}`, c), expect: manage(204) },
  { route: 'GET /api/classes/:id/invitations', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}/invitations`, c), expect: manage(200) },
  {
    route: 'POST /api/classes/:id/roster',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classId}/roster`, c).attach('file', Buffer.from(`email,name\nr${s.n}@test.example,Row ${s.n}\n`), { filename: 'r.csv', contentType: 'text/csv' }),
    expect: manage(200),
  },
  { route: 'GET /api/admin/users', send: (t, c) => call(t, 'get', '/api/admin/users', c), expect: adminOnly(200) },
  {
    route: 'POST /api/admin/instructor-invitations',
    send: (t, c, s) => call(t, 'post', '/api/admin/instructor-invitations', c).send({ email: `invitee${s.n}@test.example` }),
    expect: adminOnly(201),
  },
  { route: 'GET /api/dev/mail', send: (t, c) => call(t, 'get', '/api/dev/mail', c), expect: adminOnly(200) },
];

let t: TestApp;
let cast: Cast;
let counter = 0;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
});
afterAll(() => t.close());

const cookieOf = (actor: Actor): string | null => (actor === 'anonymous' ? null : cast[actor].cookie);

describe('access-control matrix', () => {
  const cases = ROWS.flatMap((row) => ACTORS.map((actor) => ({ row, actor, status: row.expect[actor] })));
  it.each(cases.map((c) => [c.row.route, c.actor, c.status, c] as const))('%s as %s answers %i', async (_route, actor, status, c) => {
    counter += 1;
    // Each case gets its own program and puts student B back in the class, so no case depends on another.
    const scene: Scene = { programId: await createProgramAs(t, cast.studentA, `P${counter}`), classId: cast.classId, cast, n: counter };
    await enrol(t.database.orm, cast.classId, cast.studentB.user.id, t.clock.now());
    const res = await c.row.send(t, cookieOf(actor), scene);
    expect({ status: res.status, body: res.status >= 400 ? res.body.error?.code : 'ok' }).toMatchObject({ status });
    if (res.status >= 400) expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
  });
});
