/**
 * The access-control matrix: every route × every kind of caller, in one table. To add a route, add
 * one row. The program under test belongs to student A; the class is taught by `instructor`, and
 * students A and B are in it; `otherInstructor` teaches another class. Each case also gets a fresh
 * published lab of that class (with one attachment and a graded submission by student A) and an
 * unpublished one, so deleting or unpublishing in one case changes nothing for the next.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Test } from 'supertest';
import { exportPlcopen } from '@shared/ladder/plcopen';
import { THREE_WIRE_DEMO } from '../../server/db/demoPrograms';
import { enrol } from '../../server/db/classes';
import { insertAttachment, insertLab } from '../../server/db/labs';
import { insertSubmission } from '../../server/db/submissions';
import { FORWARD_REVERSE } from '@shared/labs';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, documentWithRungs, type Cast } from './helpers/fixtures';

const ACTORS = ['anonymous', 'studentA', 'studentB', 'instructor', 'otherInstructor', 'admin'] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;

/** What a request needs: a fresh program of student A, the class id, a counter for unique values. */
interface Scene {
  programId: string;
  classId: string;
  /** A published lab of the class, with `attachmentId` and student A's `submissionId`. */
  labId: string;
  attachmentId: string;
  submissionId: string;
  /** A lab of the class that is not published: students must not learn it exists. */
  draftLabId: string;
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
/** A draft of student A's program: theirs alone; to anyone else (their instructor and admins too) it does not exist. */
const ownerOnly = (ok: number): Expected => ({ anonymous: 401, studentA: ok, studentB: 404, instructor: 404, otherInstructor: 404, admin: 404 });
/** Manage the class: its instructor and admins; enrolled students know it exists (403). */
const manage = (ok: number): Expected => ({ anonymous: 401, studentA: 403, studentB: 403, instructor: ok, otherInstructor: 404, admin: ok });
const adminOnly = (ok: number): Expected => ({ anonymous: 401, studentA: 403, studentB: 403, instructor: 403, otherInstructor: 403, admin: ok });
/** See a published lab: its class's students, instructor and admins. */
const viewLab = (ok: number): Expected => ({ anonymous: 401, studentA: ok, studentB: ok, instructor: ok, otherInstructor: 404, admin: ok });
/** Work on a lab (open, submit, own submissions): students of the class; staff know it exists (403). */
const workLab = (ok: number): Expected => ({ anonymous: 401, studentA: ok, studentB: ok, instructor: 403, otherInstructor: 404, admin: 403 });
/** A submission of student A in full: staff of the class; its student knows it exists (403), others do not. */
const reviewA = (ok: number): Expected => ({ anonymous: 401, studentA: 403, studentB: 404, instructor: ok, otherInstructor: 404, admin: ok });
/** A PNG by its signature (the eight bytes 89 50 4E 47 0D 0A 1A 0A; PNG specification, ISO/IEC 15948 §5.2, from memory), then padding. */
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64)]);

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
  { route: 'GET /api/programs/:id/draft', send: (t, c, s) => call(t, 'get', `/api/programs/${s.programId}/draft`, c), expect: ownerOnly(200) },
  {
    route: 'PUT /api/programs/:id/draft',
    send: (t, c, s) => call(t, 'put', `/api/programs/${s.programId}/draft`, c).send({ baseVersion: 1, document: documentWithRungs(2) }),
    expect: ownerOnly(200),
  },
  { route: 'DELETE /api/programs/:id/draft', send: (t, c, s) => call(t, 'delete', `/api/programs/${s.programId}/draft`, c), expect: ownerOnly(204) },
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
  // Labs (issue 8).
  {
    route: 'GET /api/lab-templates',
    send: (t, c) => call(t, 'get', '/api/lab-templates', c),
    expect: { anonymous: 401, studentA: 403, studentB: 403, instructor: 200, otherInstructor: 200, admin: 200 },
  },
  { route: 'GET /api/classes/:id/labs', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}/labs`, c), expect: viewLab(200) },
  {
    route: 'POST /api/classes/:id/labs',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classId}/labs`, c).send({ title: `Lab ${s.n}`, script: FORWARD_REVERSE.script }),
    expect: manage(201),
  },
  {
    route: 'POST /api/classes/:id/labs/from-template',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classId}/labs/from-template`, c).send({ templateId: FORWARD_REVERSE.id }),
    expect: manage(201),
  },
  { route: 'GET /api/labs/:id', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}`, c), expect: viewLab(200) },
  {
    route: 'GET /api/labs/:id (unpublished)',
    send: (t, c, s) => call(t, 'get', `/api/labs/${s.draftLabId}`, c),
    expect: { anonymous: 401, studentA: 404, studentB: 404, instructor: 200, otherInstructor: 404, admin: 200 },
  },
  { route: 'PATCH /api/labs/:id', send: (t, c, s) => call(t, 'patch', `/api/labs/${s.labId}`, c).send({ title: 'Renamed lab' }), expect: manage(200) },
  { route: 'DELETE /api/labs/:id', send: (t, c, s) => call(t, 'delete', `/api/labs/${s.labId}`, c), expect: manage(204) },
  { route: 'POST /api/labs/:id/publish', send: (t, c, s) => call(t, 'post', `/api/labs/${s.draftLabId}/publish`, c).send({}), expect: { ...manage(200), studentA: 404, studentB: 404 } },
  { route: 'POST /api/labs/:id/unpublish', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/unpublish`, c).send({}), expect: manage(200) },
  { route: 'POST /api/labs/:id/try', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/try`, c).send({ programId: s.programId, version: 1 }), expect: manage(200) },
  { route: 'POST /api/labs/:id/open', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/open`, c).send({}), expect: workLab(201) },
  { route: 'POST /api/labs/:id/open (unpublished)', send: (t, c, s) => call(t, 'post', `/api/labs/${s.draftLabId}/open`, c).send({}), expect: { ...workLab(404), instructor: 403, admin: 403 } },
  { route: 'GET /api/labs/:id/self-check-script', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}/self-check-script`, c), expect: viewLab(200) },
  {
    route: 'POST /api/labs/:id/submissions',
    send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/submissions`, c).send({ programId: s.programId, version: 1 }),
    // Student B may submit, but not student A's program: a located validation error.
    expect: { ...workLab(201), studentB: 400 },
  },
  { route: 'GET /api/labs/:id/submissions/mine', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}/submissions/mine`, c), expect: workLab(200) },
  { route: 'GET /api/labs/:id/submissions', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}/submissions`, c), expect: manage(200) },
  { route: 'POST /api/labs/:id/regrade', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/regrade`, c).send({}), expect: manage(200) },
  {
    route: 'POST /api/labs/:id/attachments',
    send: (t, c, s) => call(t, 'post', `/api/labs/${s.labId}/attachments`, c).attach('file', PNG, { filename: 'wiring.png', contentType: 'image/png' }),
    expect: manage(201),
  },
  { route: 'GET /api/labs/:id/attachments', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}/attachments`, c), expect: viewLab(200) },
  { route: 'GET /api/labs/:id/attachments/:aid', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labId}/attachments/${s.attachmentId}`, c), expect: viewLab(200) },
  { route: 'DELETE /api/labs/:id/attachments/:aid', send: (t, c, s) => call(t, 'delete', `/api/labs/${s.labId}/attachments/${s.attachmentId}`, c), expect: manage(204) },
  { route: 'GET /api/submissions/:id', send: (t, c, s) => call(t, 'get', `/api/submissions/${s.submissionId}`, c), expect: reviewA(200) },
  {
    route: 'POST /api/submissions/:id/override',
    send: (t, c, s) => call(t, 'post', `/api/submissions/${s.submissionId}/override`, c).send({ score: 5, reason: 'Checked by hand' }),
    expect: reviewA(200),
  },
  { route: 'PUT /api/submissions/:id/feedback', send: (t, c, s) => call(t, 'put', `/api/submissions/${s.submissionId}/feedback`, c).send({ feedback: 'Good' }), expect: reviewA(200) },
  { route: 'POST /api/submissions/:id/return', send: (t, c, s) => call(t, 'post', `/api/submissions/${s.submissionId}/return`, c).send({}), expect: reviewA(200) },
  { route: 'GET /api/classes/:id/gradebook', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}/gradebook`, c), expect: manage(200) },
  { route: 'GET /api/classes/:id/gradebook.csv', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classId}/gradebook.csv`, c), expect: manage(200) },
];

/** A fresh published lab (with an attachment and student A's graded submission) and a draft lab. */
async function labScene(t: TestApp, cast: Cast, programId: string, n: number) {
  const orm = t.database.orm;
  const now = t.clock.now();
  const base = {
    classId: cast.classId,
    authorId: cast.instructor.user.id,
    panel: { kind: 'builtIn', id: FORWARD_REVERSE.panel },
    starterKind: 'template' as const,
    starterDocument: FORWARD_REVERSE.starter,
    checkScript: FORWARD_REVERSE.script,
    totalPoints: 10,
    createdAt: now,
    updatedAt: now,
  };
  const lab = await insertLab(orm, { ...base, title: `Matrix lab ${n}`, publishedAt: now });
  const draft = await insertLab(orm, { ...base, title: `Matrix draft ${n}` });
  const attachment = await insertAttachment(orm, { labId: lab.id, filename: 'wiring.png', contentType: 'image/png', size: PNG.length, data: PNG, createdAt: now });
  const submission = await insertSubmission(orm, {
    labId: lab.id,
    studentId: cast.studentA.user.id,
    programId,
    versionNumber: 1,
    document: documentWithRungs(1),
    status: 'graded',
    autoScore: 0,
    score: 0,
    submittedAt: now,
    gradedAt: now,
  });
  return { labId: lab.id, draftLabId: draft.id, attachmentId: attachment.id, submissionId: submission.id };
}

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
    const programId = await createProgramAs(t, cast.studentA, `P${counter}`);
    const scene: Scene = { programId, classId: cast.classId, cast, n: counter, ...(await labScene(t, cast, programId, counter)) };
    await enrol(t.database.orm, cast.classId, cast.studentB.user.id, t.clock.now());
    const res = await c.row.send(t, cookieOf(actor), scene);
    expect({ status: res.status, body: res.status >= 400 ? res.body.error?.code : 'ok' }).toMatchObject({ status });
    if (res.status >= 400) expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
  });
});
