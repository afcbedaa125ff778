/**
 * The access-control matrix: every route × every kind of caller, in one table; to add a route, add
 * one row. Access follows relationships, not roles, so the callers are the classroom of
 * `helpers/classroom.ts`: teacher A and teacher B each teach a class; `studentBoth` is in both
 * classes, `studentOne` in class A only, `studentNone` in none; the admin teaches nothing.
 *
 * Each case that changes something gets fresh work of `studentBoth` (a program outside labs, a copy
 * of a published lab in each class, a graded submission in each), a draft lab and an attachment in
 * class A, and fresh invitations, and the enrolments are put back first, so no case depends on
 * another; the callers of a read-only (GET) row share one such scene.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Response, Test } from 'supertest';
import { exportPlcopen } from '@shared/ladder/plcopen';
import { FORWARD_REVERSE } from '@shared/labs';
import { THREE_WIRE_DEMO } from '../../server/db/demoPrograms';
import { insertAttachment } from '../../server/db/labs';
import { issueScopedToken } from '../../server/db/oneTimeTokens';
import { hashToken, INVITE_TOKEN_MS, newToken } from '../../server/auth/oneTimeTokens';
import type { Express } from 'express';
import { listRoutes } from '../../server/http/routeList';
import { createTestApp, onPostgres, type TestApp } from './helpers/testApp';
import { addUser, call, documentWithRungs, signIn } from './helpers/fixtures';
import { setDeactivatedAt } from '../../server/db/users';
import { CALLERS, createClassroom, labOf, resetEnrolments, studentWork, type Caller, type Classroom, type StudentWork } from './helpers/classroom';

type Expected = Record<Caller, number>;

/** What a request needs: the classroom, this case's fresh work and labs, a counter for unique values. */
interface Scene extends StudentWork {
  room: Classroom;
  classA: string;
  classB: string;
  /** An unpublished lab of class A: students must not learn it exists. */
  draftLabA: string;
  /** An attachment of lab A. */
  attachmentA: string;
  /** Open class-A invitations to studentNone's address, teacher B's and an address with no account. */
  inviteStudentNone: string;
  inviteTeacherB: string;
  inviteNew: string;
  /** An open link to finish signing up an address with no account into class A. */
  signUpNew: string;
  /** Ids of an open class-A invitation to an address with no account, and of an open instructor invitation. */
  classInvitationId: string;
  instructorInvitationId: string;
  n: number;
}

interface Row {
  route: string;
  send: (t: TestApp, cookie: string | null, s: Scene) => Test | Promise<Response>;
  expect: Expected;
}

const SIGNED_IN = CALLERS.filter((c) => c !== 'anonymous');

/** `ok` callers answer `status`; `known` callers (who know it exists but may not do this) 403; every other signed-in caller 404; anonymous 401. */
function only(status: number, ok: readonly Caller[], known: readonly Caller[] = []): Expected {
  const expected = { anonymous: 401 } as Expected;
  for (const c of SIGNED_IN) expected[c] = ok.includes(c) ? status : known.includes(c) ? 403 : 404;
  return expected;
}
const all = (status: number): Expected => only(status, SIGNED_IN);
const adminOnly = (ok: number): Expected => only(ok, ['admin'], SIGNED_IN);

/** Work of studentBoth outside labs: theirs alone. */
const ownOnly = (ok: number): Expected => only(ok, ['studentBoth']);
/** A copy of class A's lab: read by its owner and teacher A; teacher A may not change it. */
const readCopyA = (ok: number): Expected => only(ok, ['studentBoth', 'teacherA']);
const writeCopyA = (ok: number): Expected => only(ok, ['studentBoth'], ['teacherA']);
const readCopyB = (ok: number): Expected => only(ok, ['studentBoth', 'teacherB']);
const writeCopyB = (ok: number): Expected => only(ok, ['studentBoth'], ['teacherB']);
/** Class A's business: teacher A and the admin run it; its students know it exists. */
const manageA = (ok: number): Expected => only(ok, ['teacherA', 'admin'], ['studentBoth', 'studentOne']);
/** Class A's grades and submissions: teacher A only; its students and the admin know it exists. */
const gradesA = (ok: number): Expected => only(ok, ['teacherA'], ['studentBoth', 'studentOne', 'admin']);
const gradesB = (ok: number): Expected => only(ok, ['teacherB'], ['studentBoth', 'admin']);
/** See lab A (published): class A's students, teacher A, the admin. */
const viewLabA = (ok: number): Expected => only(ok, ['studentBoth', 'studentOne', 'teacherA', 'admin']);
/** Work on lab A (open, submit, own submissions): class A's students; its staff know it exists. */
const workLabA = (ok: number): Expected => only(ok, ['studentBoth', 'studentOne'], ['teacherA', 'admin']);
/** A submission of studentBoth in full: the class's teacher; the student knows it exists. */
const reviewSubmissionA = (ok: number): Expected => only(ok, ['teacherA'], ['studentBoth']);
const reviewSubmissionB = (ok: number): Expected => only(ok, ['teacherB'], ['studentBoth']);

/** A PNG by its signature (the eight bytes 89 50 4E 47 0D 0A 1A 0A; PNG specification, ISO/IEC 15948 §5.2, from memory), then padding. */
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64)]);
const xml = exportPlcopen(THREE_WIRE_DEMO);

/** The program routes, for one program of studentBoth and who may read and change it. */
function programRows(label: string, pick: (s: Scene) => string, read: (ok: number) => Expected, write: (ok: number) => Expected): Row[] {
  const at = (s: Scene, rest = '') => `/api/programs/${pick(s)}${rest}`;
  return [
    { route: `GET /api/programs/:id (${label})`, send: (t, c, s) => call(t, 'get', at(s), c), expect: read(200) },
    { route: `PATCH /api/programs/:id (${label})`, send: (t, c, s) => call(t, 'patch', at(s), c).send({ title: 'Renamed' }), expect: write(200) },
    { route: `DELETE /api/programs/:id (${label})`, send: (t, c, s) => call(t, 'delete', at(s), c), expect: write(204) },
    { route: `GET /api/programs/:id/versions (${label})`, send: (t, c, s) => call(t, 'get', at(s, '/versions'), c), expect: read(200) },
    {
      route: `POST /api/programs/:id/versions (${label})`,
      send: (t, c, s) => call(t, 'post', at(s, '/versions'), c).send({ baseVersion: 1, document: documentWithRungs(2) }),
      expect: write(201),
    },
    { route: `GET /api/programs/:id/versions/:number (${label})`, send: (t, c, s) => call(t, 'get', at(s, '/versions/1'), c), expect: read(200) },
    { route: `GET /api/programs/:id/versions/:number/export (${label})`, send: (t, c, s) => call(t, 'get', at(s, '/versions/1/export?format=plcopen'), c), expect: read(200) },
    { route: `GET /api/programs/:id/diff (${label})`, send: (t, c, s) => call(t, 'get', at(s, '/diff?from=1&to=1'), c), expect: read(200) },
    { route: `POST /api/programs/:id/restore (${label})`, send: (t, c, s) => call(t, 'post', at(s, '/restore'), c).send({ version: 1, baseVersion: 1 }), expect: write(201) },
  ];
}

/** The draft routes of one program of studentBoth: theirs alone, to anyone else it does not exist. */
function draftRows(label: string, pick: (s: Scene) => string): Row[] {
  const at = (s: Scene) => `/api/programs/${pick(s)}/draft`;
  return [
    { route: `GET /api/programs/:id/draft (${label})`, send: (t, c, s) => call(t, 'get', at(s), c), expect: ownOnly(200) },
    { route: `PUT /api/programs/:id/draft (${label})`, send: (t, c, s) => call(t, 'put', at(s), c).send({ baseVersion: 1, document: documentWithRungs(2) }), expect: ownOnly(200) },
    { route: `DELETE /api/programs/:id/draft (${label})`, send: (t, c, s) => call(t, 'delete', at(s), c), expect: ownOnly(204) },
  ];
}

/** The proof-sheet routes of one program of studentBoth: like a draft, theirs alone. */
function proofRows(label: string, pick: (s: Scene) => string): Row[] {
  const at = (s: Scene) => `/api/programs/${pick(s)}/proof`;
  return [
    { route: `GET /api/programs/:id/proof (${label})`, send: (t, c, s) => call(t, 'get', at(s), c), expect: ownOnly(200) },
    { route: `PUT /api/programs/:id/proof (${label})`, send: (t, c, s) => call(t, 'put', at(s), c).send({ properties: [{ never: { '%QX1': true, '%QX2': true } }], checks: [] }), expect: ownOnly(200) },
  ];
}

/** The review routes of one submission of studentBoth. */
function submissionRows(label: string, pick: (s: Scene) => string, review: (ok: number) => Expected): Row[] {
  const at = (s: Scene, rest = '') => `/api/submissions/${pick(s)}${rest}`;
  return [
    { route: `GET /api/submissions/:id (${label})`, send: (t, c, s) => call(t, 'get', at(s), c), expect: review(200) },
    { route: `POST /api/submissions/:id/override (${label})`, send: (t, c, s) => call(t, 'post', at(s, '/override'), c).send({ score: 5, reason: 'Checked by hand' }), expect: review(200) },
    { route: `PUT /api/submissions/:id/feedback (${label})`, send: (t, c, s) => call(t, 'put', at(s, '/feedback'), c).send({ feedback: 'Good' }), expect: review(200) },
    { route: `POST /api/submissions/:id/return (${label})`, send: (t, c, s) => call(t, 'post', at(s, '/return'), c).send({}), expect: review(200) },
  ];
}

/** The person whose session `cookie` is; undefined for anonymous. */
function personOf(s: Scene, cookie: string | null) {
  return Object.values(s.room.people).find((p) => p.cookie === cookie);
}

/** Another session of the same person, so that ending it leaves the caller's own session alone. */
async function secondSession(t: TestApp, s: Scene, cookie: string | null): Promise<string | null> {
  const person = personOf(s, cookie);
  return person ? signIn(t, person.user.email) : null;
}

/** After a row that ended all of a caller's sessions: sign them in again for the next cases. */
async function renewSession(t: TestApp, s: Scene, cookie: string | null): Promise<void> {
  const person = personOf(s, cookie);
  if (person) person.cookie = await signIn(t, person.user.email);
}

/** A fresh account for an administrator's action to act on. */
const spareAccount = (t: TestApp, s: Scene) => addUser(t, `spare${s.n}@test.example`, 'student');

const ROWS: Row[] = [
  { route: 'GET /api/health', send: (t) => call(t, 'get', '/api/health'), expect: { ...all(200), anonymous: 200 } },
  { route: 'GET /api/me', send: (t, c) => call(t, 'get', '/api/me', c), expect: all(200) },
  // Open to anyone, signed in or not: an unknown address is refused alike for every caller.
  {
    route: 'POST /api/auth/sign-in',
    send: (t, c, s) => call(t, 'post', '/api/auth/sign-in', c).send({ email: `nobody${s.n}@test.example`, password: 'not-the-password' }),
    expect: { ...all(401), anonymous: 401 },
  },
  {
    route: 'POST /api/auth/password-reset',
    send: (t, c, s) => call(t, 'post', '/api/auth/password-reset', c).send({ email: `nobody${s.n}@test.example` }),
    expect: { ...all(202), anonymous: 202 },
  },
  {
    route: 'POST /api/auth/password-reset/confirm',
    send: (t, c) => call(t, 'post', '/api/auth/password-reset/confirm', c).send({ token: 'x'.repeat(43), password: 'a-long-enough-password' }),
    expect: { ...all(400), anonymous: 400 },
  },
  {
    route: 'POST /api/auth/sign-out',
    send: async (t, c, s) => call(t, 'post', '/api/auth/sign-out', await secondSession(t, s, c)),
    expect: { ...all(204), anonymous: 204 },
  },
  {
    route: 'POST /api/auth/sign-out-everywhere',
    send: async (t, c, s) => {
      const res = await call(t, 'post', '/api/auth/sign-out-everywhere', c);
      await renewSession(t, s, c);
      return res;
    },
    expect: all(204),
  },
  {
    // A wrong current password: who may try (400 names the field) without changing anything.
    route: 'POST /api/auth/password',
    send: (t, c) => call(t, 'post', '/api/auth/password', c).send({ currentPassword: 'not-the-password', newPassword: 'some-new-password' }),
    expect: all(400),
  },

  // Programs: the caller's own list, another person's list, and creating with or without a lab.
  { route: 'GET /api/programs', send: (t, c) => call(t, 'get', '/api/programs', c), expect: all(200) },
  {
    route: 'GET /api/programs?ownerId=studentBoth',
    send: (t, c, s) => call(t, 'get', `/api/programs?ownerId=${s.room.people.studentBoth.user.id}`, c),
    expect: only(200, ['studentBoth', 'teacherA', 'teacherB']),
  },
  { route: 'POST /api/programs', send: (t, c) => call(t, 'post', '/api/programs', c).send({ title: 'Mine' }), expect: all(201) },
  {
    route: 'POST /api/programs {labId: lab A}',
    send: (t, c, s) => call(t, 'post', '/api/programs', c).send({ title: 'For lab A', labId: s.labA }),
    expect: only(201, ['studentBoth', 'studentOne', 'teacherA', 'admin']),
  },
  {
    route: 'POST /api/programs {labId: draft lab A}',
    send: (t, c, s) => call(t, 'post', '/api/programs', c).send({ title: 'For a draft', labId: s.draftLabA }),
    expect: only(201, ['teacherA', 'admin']),
  },
  { route: 'POST /api/programs {labId: no such lab}', send: (t, c) => call(t, 'post', '/api/programs', c).send({ title: 'Nowhere', labId: randomUUID() }), expect: only(201, []) },
  ...programRows('outside labs', (s) => s.freeProgram, ownOnly, ownOnly),
  ...programRows('copy of lab A', (s) => s.copyA, readCopyA, writeCopyA),
  ...programRows('copy of lab B', (s) => s.copyB, readCopyB, writeCopyB),
  // Drafts: the owner's alone, even on a lab copy its teacher may read.
  ...draftRows('outside labs', (s) => s.freeProgram),
  ...draftRows('copy of lab A', (s) => s.copyA),
  // Proof sheets: the owner's alone too.
  ...proofRows('outside labs', (s) => s.freeProgram),
  ...proofRows('copy of lab A', (s) => s.copyA),
  {
    route: 'POST /api/programs/import',
    send: (t, c) => call(t, 'post', '/api/programs/import', c).attach('file', Buffer.from(xml), { filename: 'p.xml', contentType: 'application/xml' }),
    expect: all(201),
  },

  // Classes, rosters and invitations.
  { route: 'GET /api/classes', send: (t, c) => call(t, 'get', '/api/classes', c), expect: all(200) },
  { route: 'POST /api/classes', send: (t, c) => call(t, 'post', '/api/classes', c).send({ name: 'New class', term: 'Spring' }), expect: only(201, ['teacherA', 'teacherB', 'admin'], SIGNED_IN) },
  {
    route: 'POST /api/classes/join (class B code)',
    send: (t, c, s) => call(t, 'post', '/api/classes/join', c).send({ joinCode: s.room.classB.joinCode }),
    expect: only(200, ['studentBoth', 'studentOne', 'studentNone'], SIGNED_IN),
  },
  { route: 'GET /api/classes/:id', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}`, c), expect: only(200, ['studentBoth', 'studentOne', 'teacherA', 'admin']) },
  { route: 'POST /api/classes/:id/join-code', send: (t, c, s) => call(t, 'post', `/api/classes/${s.classA}/join-code`, c).send({}), expect: manageA(200) },
  { route: 'GET /api/classes/:id/students', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/students`, c), expect: manageA(200) },
  {
    route: 'DELETE /api/classes/:id/students/:userId',
    send: (t, c, s) => call(t, 'delete', `/api/classes/${s.classA}/students/${s.room.people.studentOne.user.id}`, c),
    expect: manageA(204),
  },
  { route: 'GET /api/classes/:id/invitations', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/invitations`, c), expect: manageA(200) },
  {
    route: 'POST /api/classes/:id/invitations',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classA}/invitations`, c).send({ email: `hand${s.n}@test.example`, name: `Hand ${s.n}` }),
    expect: manageA(201),
  },
  {
    route: 'POST /api/classes/:id/roster',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classA}/roster`, c).attach('file', Buffer.from(`email,name\nr${s.n}@test.example,Row ${s.n}\n`), { filename: 'r.csv', contentType: 'text/csv' }),
    expect: manageA(200),
  },
  // Links from e-mails: whoever holds the link may use it, signed in or not (an account is made for the link's address).
  { route: 'POST /api/auth/invitations/lookup', send: (t, c, s) => call(t, 'post', '/api/auth/invitations/lookup', c).send({ token: s.inviteNew }), expect: { ...all(200), anonymous: 200 } },
  {
    route: 'POST /api/auth/invitations/accept',
    send: (t, c, s) => call(t, 'post', '/api/auth/invitations/accept', c).send({ token: s.inviteNew, name: 'New Person', password: 'long-enough-pw' }),
    expect: { ...all(201), anonymous: 201 },
  },
  {
    // Class B's code: the join-code row draws class A a new one.
    route: 'POST /api/auth/sign-up',
    send: (t, c, s) => call(t, 'post', '/api/auth/sign-up', c).send({ email: `asked${s.n}@test.example`, name: 'Asked', joinCode: s.room.classB.joinCode }),
    expect: { ...all(202), anonymous: 202 },
  },
  { route: 'POST /api/auth/sign-up/lookup', send: (t, c, s) => call(t, 'post', '/api/auth/sign-up/lookup', c).send({ token: s.signUpNew }), expect: { ...all(200), anonymous: 200 } },
  {
    route: 'POST /api/auth/sign-up/finish',
    send: (t, c, s) => call(t, 'post', '/api/auth/sign-up/finish', c).send({ token: s.signUpNew, name: 'Signed Up', password: 'long-enough-pw' }),
    expect: { ...all(201), anonymous: 201 },
  },
  {
    // Accepted only by the invited account itself, signed in; anyone else is told it is another address's.
    route: 'POST /api/auth/invitations/join (to studentNone)',
    send: (t, c, s) => call(t, 'post', '/api/auth/invitations/join', c).send({ token: s.inviteStudentNone }),
    expect: only(200, ['studentNone'], SIGNED_IN),
  },
  {
    // An instructor's address joins no class as a student: refused to the instructor, at acceptance.
    route: 'POST /api/auth/invitations/join (to teacherB)',
    send: (t, c, s) => call(t, 'post', '/api/auth/invitations/join', c).send({ token: s.inviteTeacherB }),
    expect: only(200, [], SIGNED_IN),
  },
  { route: 'GET /api/classes/:id/gradebook', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/gradebook`, c), expect: gradesA(200) },
  { route: 'GET /api/classes/:id/gradebook.csv', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/gradebook.csv`, c), expect: gradesA(200) },
  { route: 'GET /api/classes/:id/gradebook (class B)', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classB}/gradebook`, c), expect: gradesB(200) },
  { route: 'GET /api/classes/:id/overview', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/overview`, c), expect: gradesA(200) },
  { route: 'GET /api/classes/:id/overview (class B)', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classB}/overview`, c), expect: gradesB(200) },
  // Resending or cancelling an invitation: the class's (its instructor and admins); an account invitation is the admins'.
  { route: 'POST /api/invitations/:id/resend (class A)', send: (t, c, s) => call(t, 'post', `/api/invitations/${s.classInvitationId}/resend`, c).send({}), expect: only(201, ['teacherA', 'admin']) },
  { route: 'POST /api/invitations/:id/cancel (class A)', send: (t, c, s) => call(t, 'post', `/api/invitations/${s.classInvitationId}/cancel`, c).send({}), expect: only(200, ['teacherA', 'admin']) },
  { route: 'POST /api/invitations/:id/resend (instructor)', send: (t, c, s) => call(t, 'post', `/api/invitations/${s.instructorInvitationId}/resend`, c).send({}), expect: only(201, ['admin']) },
  { route: 'POST /api/invitations/:id/cancel (instructor)', send: (t, c, s) => call(t, 'post', `/api/invitations/${s.instructorInvitationId}/cancel`, c).send({}), expect: only(200, ['admin']) },

  // Administration.
  { route: 'GET /api/admin/users', send: (t, c) => call(t, 'get', '/api/admin/users', c), expect: adminOnly(200) },
  {
    route: 'POST /api/admin/instructor-invitations',
    send: (t, c, s) => call(t, 'post', '/api/admin/instructor-invitations', c).send({ email: `invitee${s.n}@test.example` }),
    expect: adminOnly(201),
  },
  { route: 'GET /api/dev/mail', send: (t, c) => call(t, 'get', '/api/dev/mail', c), expect: adminOnly(200) },
  { route: 'GET /api/admin/status', send: (t, c) => call(t, 'get', '/api/admin/status', c), expect: adminOnly(200) },
  { route: 'GET /api/dev/mail?q=', send: (t, c) => call(t, 'get', '/api/dev/mail?q=invited', c), expect: adminOnly(200) },
  { route: 'GET /api/admin/usage', send: (t, c) => call(t, 'get', '/api/admin/usage', c), expect: adminOnly(200) },
  { route: 'GET /api/admin/invitations', send: (t, c) => call(t, 'get', '/api/admin/invitations', c), expect: adminOnly(200) },
  // On PostgreSQL the backup is pg_dump's business: the admin is told so (409).
  { route: 'GET /api/admin/backup', send: (t, c) => call(t, 'get', '/api/admin/backup', c), expect: adminOnly(onPostgres() ? 409 : 200) },
  {
    route: 'POST /api/admin/users/:id/role',
    send: async (t, c, s) => call(t, 'post', `/api/admin/users/${(await spareAccount(t, s)).id}/role`, c).send({ role: 'instructor' }),
    expect: adminOnly(200),
  },
  {
    route: 'POST /api/admin/users/:id/deactivate',
    send: async (t, c, s) => call(t, 'post', `/api/admin/users/${(await spareAccount(t, s)).id}/deactivate`, c),
    expect: adminOnly(200),
  },
  {
    route: 'POST /api/admin/users/:id/reactivate',
    send: async (t, c, s) => {
      const spare = await spareAccount(t, s);
      await setDeactivatedAt(t.database.orm, spare.id, t.clock.now());
      return call(t, 'post', `/api/admin/users/${spare.id}/reactivate`, c);
    },
    expect: adminOnly(200),
  },
  {
    route: 'POST /api/admin/users/:id/password-reset',
    send: async (t, c, s) => call(t, 'post', `/api/admin/users/${(await spareAccount(t, s)).id}/password-reset`, c),
    expect: adminOnly(202),
  },

  // Labs.
  {
    route: 'GET /api/lab-templates',
    send: (t, c) => call(t, 'get', '/api/lab-templates', c),
    expect: only(200, ['teacherA', 'teacherB', 'admin'], ['studentBoth', 'studentOne', 'studentNone']),
  },
  { route: 'GET /api/classes/:id/labs', send: (t, c, s) => call(t, 'get', `/api/classes/${s.classA}/labs`, c), expect: viewLabA(200) },
  {
    route: 'POST /api/classes/:id/labs',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classA}/labs`, c).send({ title: `Lab ${s.n}`, script: FORWARD_REVERSE.script }),
    expect: manageA(201),
  },
  {
    route: 'POST /api/classes/:id/labs/from-template',
    send: (t, c, s) => call(t, 'post', `/api/classes/${s.classA}/labs/from-template`, c).send({ templateId: FORWARD_REVERSE.id }),
    expect: manageA(201),
  },
  { route: 'GET /api/labs/:id', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}`, c), expect: viewLabA(200) },
  { route: 'GET /api/labs/:id (unpublished)', send: (t, c, s) => call(t, 'get', `/api/labs/${s.draftLabA}`, c), expect: only(200, ['teacherA', 'admin']) },
  { route: 'PATCH /api/labs/:id', send: (t, c, s) => call(t, 'patch', `/api/labs/${s.labA}`, c).send({ title: 'Renamed lab' }), expect: manageA(200) },
  { route: 'DELETE /api/labs/:id', send: (t, c, s) => call(t, 'delete', `/api/labs/${s.labA}`, c), expect: manageA(204) },
  { route: 'POST /api/labs/:id/publish', send: (t, c, s) => call(t, 'post', `/api/labs/${s.draftLabA}/publish`, c).send({}), expect: only(200, ['teacherA', 'admin']) },
  { route: 'POST /api/labs/:id/unpublish', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/unpublish`, c).send({}), expect: manageA(200) },
  {
    // "Try it" runs a program the caller may read: teacher A may try studentBoth's copy of lab A; the admin may not read it.
    route: 'POST /api/labs/:id/try (copy of lab A)',
    send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/try`, c).send({ programId: s.copyA, version: 1 }),
    expect: { ...manageA(200), admin: 404 },
  },
  { route: 'POST /api/labs/:id/try (outside labs)', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/try`, c).send({ programId: s.freeProgram, version: 1 }), expect: manageA(404) },
  // studentBoth has a copy already (200); studentOne gets one made (201).
  { route: 'POST /api/labs/:id/open', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/open`, c).send({}), expect: { ...workLabA(201), studentBoth: 200 } },
  { route: 'POST /api/labs/:id/open (unpublished)', send: (t, c, s) => call(t, 'post', `/api/labs/${s.draftLabA}/open`, c).send({}), expect: only(200, [], ['teacherA', 'admin']) },
  { route: 'GET /api/labs/:id/self-check-script', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/self-check-script`, c), expect: viewLabA(200) },
  {
    route: 'POST /api/labs/:id/submissions',
    send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/submissions`, c).send({ programId: s.copyA, version: 1 }),
    // studentOne may submit, but not studentBoth's program: a located validation error.
    expect: { ...workLabA(201), studentOne: 400 },
  },
  { route: 'GET /api/labs/:id/submissions/mine', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/submissions/mine`, c), expect: workLabA(200) },
  { route: 'GET /api/labs/:id/submissions', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/submissions`, c), expect: gradesA(200) },
  { route: 'GET /api/labs/:id/submissions (lab B)', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labB}/submissions`, c), expect: gradesB(200) },
  { route: 'POST /api/labs/:id/regrade', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/regrade`, c).send({}), expect: gradesA(200) },
  { route: 'GET /api/labs/:id/students', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/students`, c), expect: gradesA(200) },
  { route: 'GET /api/labs/:id/students (lab B)', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labB}/students`, c), expect: gradesB(200) },
  { route: 'POST /api/labs/:id/return-graded', send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/return-graded`, c).send({ note: 'Well done' }), expect: gradesA(200) },
  { route: 'GET /api/labs/:id/similar', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/similar`, c), expect: gradesA(200) },
  {
    route: 'GET /api/labs/:id/similar/pair',
    send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/similar/pair?a=${s.submissionA}&b=${s.submissionA}`, c),
    expect: gradesA(200),
  },
  {
    route: 'POST /api/labs/:id/attachments',
    send: (t, c, s) => call(t, 'post', `/api/labs/${s.labA}/attachments`, c).attach('file', PNG, { filename: 'wiring.png', contentType: 'image/png' }),
    expect: manageA(201),
  },
  { route: 'GET /api/labs/:id/attachments', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/attachments`, c), expect: viewLabA(200) },
  { route: 'GET /api/labs/:id/attachments/:attachmentId', send: (t, c, s) => call(t, 'get', `/api/labs/${s.labA}/attachments/${s.attachmentA}`, c), expect: viewLabA(200) },
  { route: 'DELETE /api/labs/:id/attachments/:attachmentId', send: (t, c, s) => call(t, 'delete', `/api/labs/${s.labA}/attachments/${s.attachmentA}`, c), expect: manageA(204) },

  // Submissions, one in each class.
  ...submissionRows('class A', (s) => s.submissionA, reviewSubmissionA),
  ...submissionRows('class B', (s) => s.submissionB, reviewSubmissionB),
];

let t: TestApp;
let room: Classroom;
let counter = 0;
/** The scene of each read-only row, shared by its callers: a GET changes nothing another caller could see. */
const readScenes = new Map<Row, Promise<Scene>>();

function sceneFor(row: Row): Promise<Scene> {
  counter += 1;
  if (!row.route.startsWith('GET ')) return scene(counter);
  let shared = readScenes.get(row);
  if (!shared) readScenes.set(row, (shared = scene(counter)));
  return shared;
}
beforeAll(async () => {
  t = await createTestApp();
  room = await createClassroom(t);
});
afterAll(() => t.close());

/** An open invitation (or sign-up link) to class A for `email`; answers the token. */
async function invitation(email: string, kind: 'invite' | 'signup' = 'invite'): Promise<string> {
  return (await invitationRow(email, kind, room.classA.id)).token;
}

/** An open invitation to class A (or, with `classId` null, to an instructor account); its token and row id. */
async function invitationRow(email: string, kind: 'invite' | 'signup', classId: string | null): Promise<{ token: string; id: string }> {
  const { token } = newToken();
  const now = t.clock.now();
  const row = await issueScopedToken(t.database.orm, { kind, tokenHash: hashToken(token), email, role: classId ? 'student' : 'instructor', classId, invitedName: 'New Person', expiresAt: new Date(now.getTime() + INVITE_TOKEN_MS), now });
  return { token, id: row.id };
}

async function scene(n: number): Promise<Scene> {
  await resetEnrolments(t, room);
  const work = await studentWork(t, room, n);
  const draft = await labOf(t, room.classA.id, room.people.teacherA.user.id, `Draft A ${n}`, true);
  const attachment = await insertAttachment(t.database.orm, { labId: work.labA, filename: 'wiring.png', contentType: 'image/png', size: PNG.length, data: PNG, createdAt: t.clock.now() });
  return {
    ...work,
    room,
    classA: room.classA.id,
    classB: room.classB.id,
    draftLabA: draft.id,
    attachmentA: attachment.id,
    inviteStudentNone: await invitation(room.people.studentNone.user.email),
    inviteTeacherB: await invitation(room.people.teacherB.user.email),
    inviteNew: await invitation(`invited${n}@test.example`),
    signUpNew: await invitation(`signing.up${n}@test.example`, 'signup'),
    classInvitationId: (await invitationRow(`by.hand${n}@test.example`, 'invite', room.classA.id)).id,
    instructorInvitationId: (await invitationRow(`new.teacher${n}@test.example`, 'invite', null)).id,
    n,
  };
}

describe('access-control matrix', () => {
  const cases = ROWS.flatMap((row) => CALLERS.map((caller) => ({ row, caller, status: row.expect[caller] })));

  it(`covers ${ROWS.length} routes × ${CALLERS.length} callers`, () => {
    expect(cases).toHaveLength(ROWS.length * CALLERS.length);
    expect(new Set(ROWS.map((r) => r.route)).size).toBe(ROWS.length);
  });

  it('has a row for every route the app serves', () => {
    const served = listRoutes(t.server.listeners('request')[0] as Express).map((r) => `${r.method} ${r.path}`);
    const covered = (route: string) => ROWS.some((row) => row.route === route || row.route.startsWith(`${route} (`));
    expect([...new Set(served)].filter((route) => !covered(route)), 'routes without a row in the matrix').toEqual([]);
  });

  it.each(cases.map((c) => [c.row.route, c.caller, c.status, c] as const))('%s as %s answers %i', async (_route, caller, status, c) => {
    const s = await sceneFor(c.row);
    const cookie = caller === 'anonymous' ? null : room.people[caller].cookie;
    const res = await c.row.send(t, cookie, s);
    expect({ status: res.status, body: res.status >= 400 ? res.body.error?.code : 'ok' }).toMatchObject({ status });
    if (res.status >= 400) expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
  });
});
