/**
 * What an instructor and an admin read of a student's work, beyond the status codes of the access
 * matrix: the lists hold only what the relationship allows, leaving a class ends the instructor's
 * view of the lab copy (not of the submitted work), and a lab id cannot be probed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { ProgramListSchema } from '@shared/api';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call } from './helpers/fixtures';
import { createClassroom, labOf, resetEnrolments, studentWork, type Classroom, type StudentWork } from './helpers/classroom';

let t: TestApp;
let room: Classroom;
let work: StudentWork;
beforeAll(async () => {
  t = await createTestApp();
  room = await createClassroom(t);
  work = await studentWork(t, room, 1);
});
afterAll(() => t.close());

const listOf = async (cookie: string) => {
  const res = await call(t, 'get', `/api/programs?ownerId=${room.people.studentBoth.user.id}`, cookie);
  expect(res.status).toBe(200);
  return ProgramListSchema.parse(res.body).programs.map((p) => p.id);
};

describe("an instructor's view of a student in two classes", () => {
  it('lists only the copy of their own lab, never the program outside labs nor the other class\'s copy', async () => {
    expect(await listOf(room.people.teacherA.cookie)).toEqual([work.copyA]);
    expect(await listOf(room.people.teacherB.cookie)).toEqual([work.copyB]);
    expect((await listOf(room.people.studentBoth.cookie)).sort()).toEqual([work.freeProgram, work.copyA, work.copyB].sort());
  });

  it('gives the same 404 body for a program outside labs as for one that does not exist', async () => {
    const hidden = await call(t, 'get', `/api/programs/${work.freeProgram}`, room.people.teacherA.cookie);
    const missing = await call(t, 'get', `/api/programs/${randomUUID()}`, room.people.teacherA.cookie);
    expect(hidden.status).toBe(404);
    expect(hidden.body).toEqual(missing.body);
  });

  it('ends the view of the lab copy when the student leaves the class, and keeps the submitted work reviewable', async () => {
    try {
      const removed = await call(t, 'delete', `/api/classes/${room.classA.id}/students/${room.people.studentBoth.user.id}`, room.people.teacherA.cookie);
      expect(removed.status).toBe(204);
      expect((await call(t, 'get', `/api/programs/${work.copyA}`, room.people.teacherA.cookie)).status).toBe(404);
      expect((await call(t, 'get', `/api/programs?ownerId=${room.people.studentBoth.user.id}`, room.people.teacherA.cookie)).status).toBe(404);
      const submission = await call(t, 'get', `/api/submissions/${work.submissionA}`, room.people.teacherA.cookie);
      expect(submission.status).toBe(200);
      expect(submission.body.submission.program.document).toBeTruthy();
      // Teacher B's view of the class B copy is untouched.
      expect((await call(t, 'get', `/api/programs/${work.copyB}`, room.people.teacherB.cookie)).status).toBe(200);
    } finally {
      await resetEnrolments(t, room);
    }
  });
});

describe("an admin's view", () => {
  it('reads no student program, submission, submission list or gradebook, and still runs the class roster', async () => {
    const admin = room.people.admin.cookie;
    expect((await call(t, 'get', `/api/programs/${work.copyA}`, admin)).status).toBe(404);
    expect((await call(t, 'get', `/api/programs?ownerId=${room.people.studentBoth.user.id}`, admin)).status).toBe(404);
    expect((await call(t, 'get', `/api/submissions/${work.submissionA}`, admin)).status).toBe(404);
    expect((await call(t, 'get', `/api/labs/${work.labA}/submissions`, admin)).status).toBe(403);
    expect((await call(t, 'get', `/api/classes/${room.classA.id}/gradebook`, admin)).status).toBe(403);
    const students = await call(t, 'get', `/api/classes/${room.classA.id}/students`, admin);
    expect(students.status).toBe(200);
    expect(students.body.students.map((s: { email: string }) => s.email).sort()).toEqual(['student.both@test.example', 'student.one@test.example']);
  });

  it('reads the work of a class the admin teaches, like any instructor', async () => {
    const cls = await call(t, 'post', '/api/classes', room.people.admin.cookie).send({ name: 'Taught by the admin', term: 'Fall' });
    expect(cls.status).toBe(201);
    const lab = await labOf(t, cls.body.class.id, room.people.admin.user.id, 'Admin lab');
    const joined = await call(t, 'post', '/api/classes/join', room.people.studentNone.cookie).send({ joinCode: cls.body.class.joinCode });
    expect(joined.status).toBe(200);
    const copy = await call(t, 'post', `/api/labs/${lab.id}/open`, room.people.studentNone.cookie).send({});
    expect(copy.status).toBe(201);
    expect((await call(t, 'get', `/api/programs/${copy.body.program.id}`, room.people.admin.cookie)).status).toBe(200);
    await resetEnrolments(t, room);
  });
});

describe('naming a lab when creating a program', () => {
  it('answers the same 404 for a lab of another class, an unpublished lab and no lab at all, and creates nothing', async () => {
    const draft = await labOf(t, room.classA.id, room.people.teacherA.user.id, 'Secret draft title', true);
    const as = room.people.studentOne.cookie;
    const before = (await call(t, 'get', '/api/programs', as)).body.programs.length;
    const otherClass = await call(t, 'post', '/api/programs', as).send({ title: 'Probe', labId: work.labB });
    const unpublished = await call(t, 'post', '/api/programs', as).send({ title: 'Probe', labId: draft.id });
    const nothing = await call(t, 'post', '/api/programs', as).send({ title: 'Probe', labId: randomUUID() });
    for (const res of [otherClass, unpublished, nothing]) expect(res.status).toBe(404);
    expect(unpublished.body).toEqual(otherClass.body);
    expect(nothing.body).toEqual(otherClass.body);
    expect(JSON.stringify([otherClass.body, unpublished.body])).not.toMatch(/Lab B|Secret draft/);
    const after = await call(t, 'get', '/api/programs', as);
    expect(after.body.programs.length).toBe(before);
  });

  it('takes a lab the student works on, and lists it with its title', async () => {
    const res = await call(t, 'post', '/api/programs', room.people.studentOne.cookie).send({ title: 'My try', labId: work.labA });
    expect(res.status).toBe(201);
    const list = ProgramListSchema.parse((await call(t, 'get', '/api/programs', room.people.studentOne.cookie)).body).programs;
    expect(list.find((p) => p.id === res.body.program.id)?.labTitle).toBe('Lab A 1');
  });

  it('names a malformed lab id (400)', async () => {
    const res = await call(t, 'post', '/api/programs', room.people.studentOne.cookie).send({ title: 'Bad', labId: 'not-a-uuid' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('labId');
  });
});
