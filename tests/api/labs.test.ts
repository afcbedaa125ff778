/**
 * The lab flow and its policies: publish (with mail), student view without the script, own copy
 * on first open, self-check script without hidden checks, submit/resubmit, late marking and
 * refusal, a student outside the class, review, override, return (with mail), regrade history.
 * Hidden checks are searched for in the raw JSON a student receives.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, person, type Cast, type Person } from './helpers/fixtures';
import { waitForMail } from './helpers/mailbox';
import { publish, saveInCopy, submitVersion } from './labsFixtures';

/** A script whose hidden checks carry labels and expectations found nowhere else. */
const SCRIPT = {
  panel: 'reversing-conveyor',
  steps: [
    { expect: { P2: 'lit' }, label: 'red lamp on at rest', points: 1 },
    { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 100 },
    { expect: { K1: 'closed' }, label: 'runs forward, sealed in', points: 2 },
    // No program here has a T9, so this hidden check always fails: the solution scores 7 of 10.
    { expect: { 'T9.ET': { min: 4321, max: 9876 } }, label: 'SECRET-hidden-timer-check', hidden: true, points: 3 },
    { press: 'S3' }, { wait: 77 }, { release: 'S3' }, { wait: 100 },
    { expect: { K2: 'open' }, label: 'SECRET-hidden-interlock', hidden: true, points: 4 },
  ],
};

let t: TestApp;
let cast: Cast;
let outsider: Person;
let labId: string;
let solutionId: string;

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  outsider = await person(t, 'outsider@test.example', 'student');
  const solution = await call(t, 'post', '/api/programs', cast.instructor.cookie).send({ title: 'Reference', document: FORWARD_REVERSE.solution });
  solutionId = solution.body.program.id;
  const res = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({
    title: 'Forward and reverse (test)',
    brief: '# Brief\nRun the belt both ways.',
    starter: { kind: 'program', programId: solutionId, version: 1 },
    script: SCRIPT,
    totalPoints: 20,
    dueAt: '2030-01-01T00:00:00Z',
    latePolicy: { kind: 'penalty', penaltyPercent: 25 },
  });
  expect(res.status, res.text).toBe(201);
  labId = res.body.lab.id;
}, 60_000);
afterAll(() => t.close());

const SECRETS = ['SECRET-hidden-timer-check', 'SECRET-hidden-interlock', '"min":4321', '"max":9876', 'T9.ET', '"wait":77', 'press S3'];
const expectNoSecrets = (raw: string) => {
  for (const secret of SECRETS) expect(raw, `leaked ${secret}`).not.toContain(secret);
};

describe('authoring', () => {
  it('names the step and field of a bad script and the field of a bad panel', async () => {
    const bad = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({ title: 'Bad', script: { steps: [{ wait: 10 }, { press: 'Z9' }, { expect: { P2: 'lit' }, label: 'red lamp at rest' }] } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['script.steps.1']).toMatch(/step 2/);
    const badPanel = await call(t, 'post', `/api/classes/${cast.classId}/labs`, cast.instructor.cookie).send({ title: 'Bad', script: SCRIPT, panel: { kind: 'custom', layout: { format: 'nope' } } });
    expect(badPanel.status).toBe(400);
    expect(Object.keys(badPanel.body.error.fields)).toContain('panel.layout');
  });

  it('keeps an unpublished lab from students', async () => {
    expect((await call(t, 'get', `/api/labs/${labId}`, cast.studentA.cookie)).status).toBe(404);
    const list = await call(t, 'get', `/api/classes/${cast.classId}/labs`, cast.studentA.cookie);
    expect(list.body.labs).toEqual([]);
  });

  it('"Try it" returns the full report on the instructor program, hidden checks included', async () => {
    const res = await call(t, 'post', `/api/labs/${labId}/try`, cast.instructor.cookie).send({ programId: solutionId, version: 1 });
    expect(res.status, res.text).toBe(200);
    expect(res.body.report.checks.map((c: { label: string }) => c.label)).toContain('SECRET-hidden-interlock');
    expect((await call(t, 'post', `/api/labs/${labId}/try`, cast.studentA.cookie).send({ programId: solutionId, version: 1 })).status).toBe(404);
  });

  it('publishing mails the students of the class', async () => {
    await publish(t, cast.instructor, labId);
    const mail = await waitForMail(t, cast.admin.cookie, cast.studentA.user.email);
    expect(mail.subject).toContain('Forward and reverse (test)');
    expect(mail.text).toContain(`/labs/${labId}`);
  });
});

describe('the student side', () => {
  it('shows the lab without its script and the class list with status', async () => {
    const res = await call(t, 'get', `/api/labs/${labId}`, cast.studentA.cookie);
    expect(res.status).toBe(200);
    expect(res.body.lab.script).toBeNull();
    expect(res.body.lab.checks).toEqual({ visible: 2, hidden: 2, maxScore: 10 });
    expectNoSecrets(res.text);
    const list = await call(t, 'get', `/api/classes/${cast.classId}/labs`, cast.studentA.cookie);
    expect(list.body.labs[0]).toMatchObject({ id: labId, dueAt: '2030-01-01T00:00:00.000Z', status: { state: 'not_started' } });
  });

  it('makes the student copy of the starter once', async () => {
    const first = await call(t, 'post', `/api/labs/${labId}/open`, cast.studentA.cookie).send({});
    const second = await call(t, 'post', `/api/labs/${labId}/open`, cast.studentA.cookie).send({});
    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(second.body.program.id).toBe(first.body.program.id);
    expect(first.body.program.labId).toBe(labId);
    expect(first.body.head.document).toEqual(FORWARD_REVERSE.solution);
    // "My programs" names the lab the copy belongs to.
    const list = await call(t, 'get', '/api/programs', cast.studentA.cookie);
    const row = list.body.programs.find((p: { id: string }) => p.id === first.body.program.id);
    expect(row).toMatchObject({ labId, labTitle: 'Forward and reverse (test)' });
  });

  it('gives a self-check script with the visible checks only, and nothing of the hidden ones', async () => {
    const res = await call(t, 'get', `/api/labs/${labId}/self-check-script`, cast.studentA.cookie);
    expect(res.status).toBe(200);
    expectNoSecrets(res.text);
    expect(res.body.script.steps.filter((s: object) => 'expect' in s).map((s: { label: string }) => s.label)).toEqual(['red lamp on at rest', 'runs forward, sealed in']);
    // Steps 1-6, up to the last visible check; the hidden steps after it stay on the server.
    expect(res.body.script.steps).toEqual(SCRIPT.steps.slice(0, 6));
    expect(res.body.withheld).toEqual({ hiddenChecks: 2, hiddenPoints: 7 });
  });

  it('grades a submission and never sends the hidden checks to the student', async () => {
    const ref = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution);
    const res = await submitVersion(t, cast.studentA, labId, ref);
    expect(res.status, res.text).toBe(201);
    expect(res.body.submission).toMatchObject({ status: 'graded', late: false, version: ref.version });
    expectNoSecrets(res.text);
    const hidden = res.body.submission.report.checks.filter((c: { hidden: boolean }) => c.hidden);
    expect(hidden).toHaveLength(2);
    for (const h of hidden) expect(Object.keys(h).sort()).toEqual(['hidden', 'passed', 'points']);
    const mine = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentA.cookie);
    expect(mine.body.submissions).toHaveLength(1);
    expectNoSecrets(mine.text);
  });

  it('tells the student nothing of the run after the last visible check: no time, scans, events or trace', async () => {
    const [mine] = (await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentA.cookie)).body.submissions;
    const full = (await call(t, 'get', `/api/submissions/${mine.id}`, cast.instructor.cookie)).body.submission.report;
    const lastVisible = full.checks.filter((c: { hidden: boolean }) => !c.hidden).at(-1);
    // The hidden steps after it (press S3, wait 77 ms, release, wait 100 ms) run 180 ms at 10 ms scans.
    expect(full.virtualMs - lastVisible.atMs).toBe(180);
    const student = mine.report;
    expect(student.virtualMs).toBe(lastVisible.atMs);
    expect(student.scans).toBe(full.scans - 18);
    expect(full.events.some((e: { step: number }) => e.step > lastVisible.index)).toBe(true);
    expect(student.events.every((e: { step: number }) => e.step <= lastVisible.index)).toBe(true);
    expect(full.trace.rows.some((row: number[]) => row[0]! > lastVisible.atMs)).toBe(true);
    expect(student.trace.rows.every((row: number[]) => row[0]! <= lastVisible.atMs)).toBe(true);
  });

  it('takes a resubmission before the due date', async () => {
    const ref = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.starter);
    expect((await submitVersion(t, cast.studentA, labId, ref)).status).toBe(201);
    const mine = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentA.cookie);
    expect(mine.body.submissions).toHaveLength(2);
  });

  it('refuses a student outside the class, and a program that is not theirs', async () => {
    const foreign = await call(t, 'post', '/api/programs', outsider.cookie).send({ title: 'Mine', document: FORWARD_REVERSE.solution });
    const res = await submitVersion(t, outsider, labId, { programId: foreign.body.program.id, version: 1 });
    expect(res.status).toBe(404);
    const notMine = await submitVersion(t, cast.studentB, labId, { programId: solutionId, version: 1 });
    expect(notMine.status).toBe(400);
    expect(notMine.body.error.fields.programId).toBeDefined();
  });

  it('marks a submission after the due date late with the penalty, and a refusing policy refuses it', async () => {
    // Moving the clock would end the sessions; moving the due date into the past is the same test.
    expect((await call(t, 'patch', `/api/labs/${labId}`, cast.instructor.cookie).send({ dueAt: '2001-01-01T00:00:00Z' })).status).toBe(200);
    const ref = await saveInCopy(t, cast.studentB, labId, FORWARD_REVERSE.solution);
    const late = await submitVersion(t, cast.studentB, labId, ref);
    expect(late.status).toBe(201);
    expect(late.body.submission).toMatchObject({ late: true, penaltyPercent: 25, autoScore: 10.5 });
    await call(t, 'patch', `/api/labs/${labId}`, cast.instructor.cookie).send({ latePolicy: { kind: 'refuse' } });
    const refused = await submitVersion(t, cast.studentB, labId, ref);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/due date/);
  });
});

describe('instructor review', () => {
  it('lists, filters and sorts submissions, shows the full report, overrides, returns with mail', async () => {
    const list = await call(t, 'get', `/api/labs/${labId}/submissions?sort=student&order=asc`, cast.instructor.cookie);
    expect(list.status).toBe(200);
    expect(list.body.submissions).toHaveLength(3);
    expect(list.body.submissions.map((s: { student: { name: string } }) => s.student.name)).toEqual(['student.a', 'student.a', 'student.b']);
    const lateOnly = await call(t, 'get', `/api/labs/${labId}/submissions?late=true`, cast.instructor.cookie);
    expect(lateOnly.body.submissions).toHaveLength(1);
    const latest = await call(t, 'get', `/api/labs/${labId}/submissions?latest=true`, cast.instructor.cookie);
    expect(latest.body.submissions).toHaveLength(2);
    expect((await call(t, 'get', `/api/labs/${labId}/submissions?sort=nonsense`, cast.instructor.cookie)).status).toBe(400);

    const id = lateOnly.body.submissions[0].id as string;
    const detail = await call(t, 'get', `/api/submissions/${id}`, cast.instructor.cookie);
    expect(detail.body.submission.report.checks.map((c: { label: string }) => c.label)).toContain('SECRET-hidden-timer-check');
    expect(detail.body.submission.program.document).toEqual(FORWARD_REVERSE.solution);
    expect((await call(t, 'get', `/api/submissions/${id}`, cast.studentB.cookie)).status).toBe(403);
    expect((await call(t, 'get', `/api/submissions/${id}`, cast.studentA.cookie)).status).toBe(404);

    const over = await call(t, 'post', `/api/submissions/${id}/override`, cast.instructor.cookie).send({ score: 18, reason: 'Late for a documented reason' });
    expect(over.body.submission).toMatchObject({ overrideScore: 18, finalScore: 18, autoScore: 10.5 });
    expect((await call(t, 'post', `/api/submissions/${id}/override`, cast.instructor.cookie).send({ score: 21, reason: 'x' })).status).toBe(400);
    const before = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentB.cookie);
    expect(before.body.submissions[0]).toMatchObject({ finalScore: 10.5, feedback: null });

    const returned = await call(t, 'post', `/api/submissions/${id}/return`, cast.instructor.cookie).send({ feedback: 'Good interlocks.' });
    expect(returned.body.submission.status).toBe('returned');
    // Student B also got the publication notice; wait for the return notice itself.
    const mail = await waitForMail(t, cast.admin.cookie, cast.studentB.user.email, 'Returned');
    expect(mail.subject).toContain('Returned');
    expect(mail.text).toContain('18 of 20');
    const after = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentB.cookie);
    expect(after.body.submissions[0]).toMatchObject({ status: 'returned', finalScore: 18, feedback: 'Good interlocks.' });
    expectNoSecrets(after.text);
  });

  it('regrades after the checks change and keeps the old report in history', async () => {
    const changed = { ...SCRIPT, steps: SCRIPT.steps.map((s) => ('label' in s && s.label === 'red lamp on at rest' ? { ...s, expect: { P2: 'dark' } } : s)) };
    expect((await call(t, 'patch', `/api/labs/${labId}`, cast.instructor.cookie).send({ script: changed })).status).toBe(200);
    const res = await call(t, 'post', `/api/labs/${labId}/regrade`, cast.instructor.cookie).send({});
    expect(res.body).toEqual({ regraded: 3, limited: 0 });
    const list = await call(t, 'get', `/api/labs/${labId}/submissions?sort=submittedAt&order=asc`, cast.instructor.cookie);
    const detail = await call(t, 'get', `/api/submissions/${list.body.submissions[0].id}`, cast.instructor.cookie);
    expect(detail.body.submission.history).toHaveLength(1);
    expect(detail.body.submission.history[0].report.score).toBe(7);
    expect(detail.body.submission.report.score).toBe(6);
    expect((await call(t, 'post', `/api/labs/${labId}/regrade`, cast.studentA.cookie).send({})).status).toBe(403);
  });
});
