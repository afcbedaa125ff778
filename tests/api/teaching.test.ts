/**
 * The instructor's week through the API: the class overview, every enrolled student on a lab
 * (including who has not started), late days, "return all graded" with a note, similar
 * submissions side by side, and a new lab's default weight.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { THREE_WIRE } from '@shared/labs';
import { ClassOverviewSchema, LabStudentListSchema, SideBySideSchema, SimilarListSchema } from '@shared/api/teaching';
import { enrol } from '../../server/db/classes';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, person, signIn, type Cast, type Person } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';
import { waitForMail } from './helpers/mailbox';

let t: TestApp;
let cast: Cast;
let studentC: Person;
let labId: string;
let earlyLabId: string;
const DAY = 24 * 60 * 60 * 1000;

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  studentC = await person(t, 'student.c@test.example', 'student');
  await enrol(t.database.orm, cast.classId, studentC.user.id, t.clock.now());
  const due = new Date(t.clock.now().getTime() + DAY);
  ({ labId } = await labFromTemplate(t, cast.instructor, cast.classId, THREE_WIRE.id, { dueAt: due.toISOString(), latePolicy: { kind: 'penalty', penaltyPercent: 10 } }));
  // Made later but due earlier: the overview and the gradebook put it first.
  ({ labId: earlyLabId } = await labFromTemplate(t, cast.instructor, cast.classId, 'two-wire', { dueAt: new Date(due.getTime() - DAY / 2).toISOString() }));
  await publish(t, cast.instructor, labId);
  await publish(t, cast.instructor, earlyLabId);
  const submitted = await submitVersion(t, cast.studentA, labId, await saveInCopy(t, cast.studentA, labId, THREE_WIRE.solution));
  expect(submitted.status, submitted.text).toBe(201);
  // Student C opens the lab (in progress) and submits late, a day and a half after the due date.
  const ref = await saveInCopy(t, studentC, labId, THREE_WIRE.solution);
  t.clock.advance(DAY + 1.5 * DAY);
  // Sessions last 8 hours: everyone signs in again on the later day.
  for (const p of [cast.admin, cast.instructor, cast.otherInstructor, cast.studentA, cast.studentB, studentC]) p.cookie = await signIn(t, p.user.email);
  const late = await submitVersion(t, studentC, labId, ref);
  expect(late.status, late.text).toBe(201);
}, 60_000);
afterAll(() => t.close());

describe('the class overview', () => {
  it('counts each lab’s students by standing, in due order, with the average and what needs grading', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/overview`, cast.instructor.cookie);
    expect(res.status, res.text).toBe(200);
    const overview = ClassOverviewSchema.parse(res.body);
    expect(overview.students).toBe(3);
    expect(overview.labs.map((l) => l.id)).toEqual([earlyLabId, labId]);
    const lab = overview.labs[1]!;
    expect(lab.counts).toEqual({ not_started: 1, in_progress: 0, submitted: 2, returned: 0, late: 1 });
    expect(lab.needsGrading).toBe(2);
    // The checks are worth 13 points: 13 on time, 13 less 10 % late; the mean of 13 and 11.7.
    expect(lab.totalPoints).toBe(13);
    expect(lab.average).toBe(12.35);
    expect(overview.labs[0]!.counts).toMatchObject({ not_started: 3, submitted: 0 });
    expect(overview.labs[0]!.average).toBeNull();
  });

  it('is the class’s instructor’s alone: the admin and the students are refused, another instructor does not see it', async () => {
    expect((await call(t, 'get', `/api/classes/${cast.classId}/overview`, cast.admin.cookie)).status).toBe(403);
    expect((await call(t, 'get', `/api/classes/${cast.classId}/overview`, cast.studentA.cookie)).status).toBe(403);
    expect((await call(t, 'get', `/api/classes/${cast.classId}/overview`, cast.otherInstructor.cookie)).status).toBe(404);
    expect((await call(t, 'get', `/api/classes/${cast.classId}/overview`)).status).toBe(401);
  });
});

describe('a lab’s students', () => {
  it('lists every enrolled student, those who have not started too, with status, score and late days', async () => {
    const res = await call(t, 'get', `/api/labs/${labId}/students`, cast.instructor.cookie);
    expect(res.status, res.text).toBe(200);
    const rows = LabStudentListSchema.parse(res.body).students;
    const by = (p: Person) => rows.find((r) => r.student.id === p.user.id)!;
    expect(rows).toHaveLength(3);
    expect(by(cast.studentB)).toMatchObject({ standing: 'not_started', submissionId: null, status: null, lateDays: 0, finalScore: null });
    expect(by(cast.studentA)).toMatchObject({ standing: 'submitted', status: 'graded', late: false, lateDays: 0, finalScore: 13 });
    expect(by(studentC)).toMatchObject({ standing: 'submitted', status: 'graded', late: true, lateDays: 2, penaltyPercent: 10, finalScore: 11.7 });
  });

  it('puts late days and the penalty in the gradebook', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/gradebook`, cast.instructor.cookie);
    expect(res.body.labs.map((l: { id: string }) => l.id)).toEqual([earlyLabId, labId]);
    const row = res.body.rows.find((r: { student: { id: string } }) => r.student.id === studentC.user.id);
    expect(row.cells[1]).toMatchObject({ late: true, lateDays: 2, penaltyPercent: 10, finalScore: 11.7 });
    expect(res.body.labs[1]).toMatchObject({ totalPoints: 13, checkPoints: 13 });
  });
});

describe('similar submissions', () => {
  it('lists two identical solutions as a pair, and shows them side by side with every written rung matched', async () => {
    const res = await call(t, 'get', `/api/labs/${labId}/similar`, cast.instructor.cookie);
    expect(res.status, res.text).toBe(200);
    const list = SimilarListSchema.parse(res.body);
    expect(list.compared).toBe(2);
    expect(list.pairs).toHaveLength(1);
    expect(list.pairs[0]!.score).toBe(1);
    const pair = list.pairs[0]!;
    const side = await call(t, 'get', `/api/labs/${labId}/similar/pair?a=${pair.a.submissionId}&b=${pair.b.submissionId}`, cast.instructor.cookie);
    expect(side.status, side.text).toBe(200);
    const view = SideBySideSchema.parse(side.body);
    expect(view.a.rungs.map((r) => r.matched)).toEqual([true, true, true]);
    expect(view.a.rungs[0]!.text).toContain('Stop_PB');
  });

  it('refuses a pair that is not of this lab, and a malformed id by name', async () => {
    const list = SimilarListSchema.parse((await call(t, 'get', `/api/labs/${labId}/similar`, cast.instructor.cookie)).body);
    const a = list.pairs[0]!.a.submissionId;
    expect((await call(t, 'get', `/api/labs/${earlyLabId}/similar/pair?a=${a}&b=${a}`, cast.instructor.cookie)).status).toBe(404);
    const bad = await call(t, 'get', `/api/labs/${labId}/similar/pair?a=nope&b=${a}`, cast.instructor.cookie);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('a');
    expect((await call(t, 'get', `/api/labs/${labId}/similar`, cast.admin.cookie)).status).toBe(403);
  });
});

describe('return all graded', () => {
  it('returns each graded newest submission once, adds the note to the feedback and e-mails each student', async () => {
    const bad = await call(t, 'post', `/api/labs/${labId}/return-graded`, cast.instructor.cookie).send({ note: 5 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('note');
    expect((await call(t, 'post', `/api/labs/${labId}/return-graded`, cast.admin.cookie).send({})).status).toBe(403);
    const res = await call(t, 'post', `/api/labs/${labId}/return-graded`, cast.instructor.cookie).send({ note: 'See me about the overload rung.' });
    expect(res.status, res.text).toBe(200);
    expect(res.body).toEqual({ returned: 2 });
    const rows = LabStudentListSchema.parse((await call(t, 'get', `/api/labs/${labId}/students`, cast.instructor.cookie)).body).students;
    expect(rows.filter((r) => r.standing === 'returned')).toHaveLength(2);
    const detail = await call(t, 'get', `/api/submissions/${rows.find((r) => r.student.id === cast.studentA.user.id)!.submissionId}`, cast.instructor.cookie);
    expect(detail.body.submission.feedback).toBe('See me about the overload rung.');
    const mail = await waitForMail(t, cast.admin.cookie, cast.studentA.user.email, 'Returned');
    expect(mail.text).toContain('See me about the overload rung.');
    // Nothing left to return: a second click returns none and sends nothing twice.
    expect((await call(t, 'post', `/api/labs/${labId}/return-graded`, cast.instructor.cookie).send({})).body).toEqual({ returned: 0 });
  });
});

describe('a new lab’s weight', () => {
  it('defaults to what its checks are worth, and the instructor may scale it', async () => {
    const script = { panel: 'reversing-conveyor', steps: [{ expect: { K1: 'open' }, label: 'at rest', points: 2 }, { expect: { P2: 'lit' }, label: 'red lamp' }] };
    const made = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({ title: 'Small', script });
    expect(made.status, made.text).toBe(201);
    expect(made.body.lab.totalPoints).toBe(3);
    const scaled = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({ title: 'Scaled', script, totalPoints: 30 });
    expect(scaled.body.lab.totalPoints).toBe(30);
  });
});
