/**
 * The standard labs' answers stay on the server: a class runs all seven, and nothing a student
 * receives — the template list, the class's labs, each lab, its self-check script, their copy,
 * their submissions and reports, the gradebook — holds a hidden check's label or place, or a
 * reference solution beyond the starter they are given. What a student receives still grades
 * alike: a self-check of the self-check script on a document shows the visible checks of the
 * server's report on it, at the same step numbers and times, with the same visible score.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCheckScript, runChecks, studentScript, type CheckResult, type CheckScript, type GradeReport, type StudentReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { STANDARD_LABS, type Lab } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import { answerMarkers, answersIn, type AnswerMarker } from '../unit/labs/answerMarkers';
import { MISTAKES } from '../unit/labs/mistakes';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';

let t: TestApp;
let cast: Cast;
const labIds = new Map<string, string>();

beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
  for (const lab of STANDARD_LABS) {
    const { labId } = await labFromTemplate(t, cast.instructor, cast.classId, lab.id);
    await publish(t, cast.instructor, labId);
    labIds.set(lab.id, labId);
  }
}, 120_000);
afterAll(() => t.close());

/** Hidden checks of every lab; of the lab itself, its reference rungs that are not in its starter. */
function answersOf(lab: Lab): AnswerMarker[] {
  const others = STANDARD_LABS.filter((l) => l.id !== lab.id);
  return [...answerMarkers([lab], { beyondStarter: true }), ...answerMarkers(others).filter((m) => m.kind === 'hidden check')];
}

function expectNoAnswers(raw: string, lab: Lab, what: string): void {
  const found = answersIn(raw, answersOf(lab)).map((m) => `${m.lab} ${m.kind} "${m.text}"`);
  expect(found, `${what} of ${lab.id}`).toEqual([]);
}

function parsed(lab: Lab): CheckScript {
  const script = parseCheckScript(lab.script);
  if (!script.ok) throw new Error(script.errors.join('\n'));
  return script.value;
}

const wrongAnswerOf = (lab: Lab): Program => MISTAKES.find((m) => m.lab === lab.id)!.program;

describe('what the standard labs look like to a student', () => {
  it('gives a student no template list, and an instructor one without scripts or solutions', async () => {
    const student = await call(t, 'get', '/api/lab-templates', cast.studentA.cookie);
    expect(student.status).toBe(403);
    const instructor = await call(t, 'get', '/api/lab-templates', cast.instructor.cookie);
    expect(instructor.status).toBe(200);
    expect(instructor.body.templates.map((x: { id: string }) => x.id)).toEqual(STANDARD_LABS.map((l) => l.id));
    for (const template of instructor.body.templates) expect(Object.keys(template).sort()).toEqual(['id', 'order', 'panel', 'summary', 'title']);
    expect(answersIn(instructor.text, answerMarkers(STANDARD_LABS))).toEqual([]);
    expect(answersIn(student.text, answerMarkers(STANDARD_LABS))).toEqual([]);
  });

  it('lists the class\'s labs without answers', async () => {
    const res = await call(t, 'get', `/api/classes/${cast.classId}/labs`, cast.studentA.cookie);
    expect(res.status).toBe(200);
    expect(res.body.labs).toHaveLength(STANDARD_LABS.length);
    expect(answersIn(res.text, answerMarkers(STANDARD_LABS))).toEqual([]);
  });

  describe.each(STANDARD_LABS.map((lab) => [lab.id, lab] as const))('%s', (_id, lab) => {
    const labId = () => labIds.get(lab.id)!;

    it('shows the lab without its script, and the copy holds the starter and nothing more', async () => {
      const view = await call(t, 'get', `/api/labs/${labId()}`, cast.studentA.cookie);
      expect(view.status).toBe(200);
      expect(view.body.lab.script).toBeNull();
      expectNoAnswers(view.text, lab, 'the lab view');
      const opened = await call(t, 'post', `/api/labs/${labId()}/open`, cast.studentA.cookie).send({});
      expect([200, 201]).toContain(opened.status);
      expect(opened.body.head.document).toEqual(lab.starter);
      expectNoAnswers(opened.text, lab, 'the copy');
      const attachments = await call(t, 'get', `/api/labs/${labId()}/attachments`, cast.studentA.cookie);
      expectNoAnswers(attachments.text, lab, 'the attachment list');
    });

    it('gives the student\'s script: no hidden check, nothing past the last visible check, no place of a hidden one', async () => {
      const res = await call(t, 'get', `/api/labs/${labId()}/self-check-script`, cast.studentA.cookie);
      expect(res.status).toBe(200);
      expectNoAnswers(res.text, lab, 'the self-check script');
      expect(Object.keys(res.body).sort()).toEqual(['script', 'withheld']);
      expect(res.body.script).toEqual(studentScript(parsed(lab)).script);
      expect(res.text).not.toMatch(/"hidden"/);
      const steps = res.body.script.steps as object[];
      expect('expect' in steps.at(-1)!).toBe(true);
      const hidden = parsed(lab).steps.filter((s) => 'expect' in s && s.hidden);
      expect(res.body.withheld).toEqual({ hiddenChecks: hidden.length, hiddenPoints: hidden.reduce((sum, s) => sum + ('expect' in s ? (s.points ?? 1) : 0), 0) });
    });

    it('grades the reference solution and a wrong answer as a self-check shows them, and reports no hidden check\'s place', async () => {
      const selfCheck = (await call(t, 'get', `/api/labs/${labId()}/self-check-script`, cast.studentA.cookie)).body.script;
      for (const [name, document] of [
        ['reference solution', lab.solution],
        ['wrong answer', wrongAnswerOf(lab)],
      ] as const) {
        const ref = await saveInCopy(t, cast.studentA, labId(), document);
        const submitted = await submitVersion(t, cast.studentA, labId(), ref);
        expect(submitted.status, submitted.text).toBe(201);
        expect(submitted.body.submission.status).toBe('graded');
        expectNoAnswers(submitted.text, lab, `the ${name}'s submission`);
        const report = submitted.body.submission.report as StudentReport;
        const visible = report.checks.filter((c): c is CheckResult => !c.hidden);
        const hidden = report.checks.filter((c) => c.hidden);
        // Hidden checks: pass or fail and points, after the visible ones.
        expect(report.checks.slice(visible.length)).toEqual(hidden);
        for (const h of hidden) expect(Object.keys(h).sort(), name).toEqual(['hidden', 'passed', 'points']);

        const self = runChecks({ program: document, panel: REVERSING_CONVEYOR, script: selfCheck });
        if (!self.ok) throw new Error(self.errors.join('\n'));
        expect(visible, name).toEqual(self.report.checks);
        expect([report.virtualMs, report.scans, report.trace, report.events], name).toEqual([self.report.virtualMs, self.report.scans, self.report.trace, self.report.events]);

        // The server's own report: the visible score is the self-check's.
        const full = (await call(t, 'get', `/api/submissions/${submitted.body.submission.id}`, cast.instructor.cookie)).body.submission.report as GradeReport;
        const visiblePoints = full.checks.reduce((sum, c) => sum + (!c.hidden && c.passed ? c.points : 0), 0);
        expect(self.report.score, name).toBe(visiblePoints);
        expect(report.score, name).toBe(full.score);
      }
      const mine = await call(t, 'get', `/api/labs/${labId()}/submissions/mine`, cast.studentA.cookie);
      expect(mine.body.submissions).toHaveLength(2);
      expectNoAnswers(mine.text, lab, 'the submission list');
      expect((await call(t, 'get', `/api/submissions/${mine.body.submissions[0].id}`, cast.studentA.cookie)).status).toBe(403);
    });
  });

  it('keeps the gradebook, as a student asks for it, free of answers', async () => {
    for (const path of [`/api/classes/${cast.classId}/gradebook`, `/api/classes/${cast.classId}/gradebook.csv`]) {
      const res = await call(t, 'get', path, cast.studentA.cookie);
      expect(answersIn(res.text, answerMarkers(STANDARD_LABS))).toEqual([]);
    }
  });
});
