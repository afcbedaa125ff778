/**
 * Grading through the API: every standard lab's reference solution scores full marks, and the
 * typical wrong answers of tests/unit/labs lose exactly the points of the checks they should fail.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STANDARD_LABS } from '@shared/labs';
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
}, 60_000);
afterAll(() => t.close());

describe('server grading of the standard labs', () => {
  it.each(STANDARD_LABS.map((lab) => [lab.id, lab] as const))('the reference solution of %s scores full marks', async (_id, lab) => {
    const labId = labIds.get(lab.id)!;
    const ref = await saveInCopy(t, cast.studentA, labId, lab.solution);
    const res = await submitVersion(t, cast.studentA, labId, ref);
    expect(res.status, res.text).toBe(201);
    const s = res.body.submission;
    expect(s.status).toBe('graded');
    expect(s.gradingNote).toBeNull();
    expect(s.autoScore).toBe(s.totalPoints);
    expect(s.report.passed).toBe(true);
    expect(s.report.score).toBe(s.report.maxScore);
  });

  it.each(MISTAKES.map((m) => [m.lab, m.name, m] as const))('%s: "%s" loses the points of the checks it should fail', async (_lab, _name, mistake) => {
    const lab = STANDARD_LABS.find((l) => l.id === mistake.lab)!;
    const labId = labIds.get(lab.id)!;
    const ref = await saveInCopy(t, cast.studentB, labId, mistake.program);
    const res = await submitVersion(t, cast.studentB, labId, ref);
    expect(res.status, res.text).toBe(201);
    // The instructor's full report names the failed checks; the student's hides the hidden ones.
    const detail = await call(t, 'get', `/api/submissions/${res.body.submission.id}`, cast.instructor.cookie);
    expect(detail.status).toBe(200);
    const report = detail.body.submission.report as { checks: { label: string; passed: boolean; points: number }[]; maxScore: number; score: number };
    const failed = report.checks.filter((c) => !c.passed);
    expect(failed.map((c) => c.label)).toEqual(mistake.fails);
    const lost = failed.reduce((sum, c) => sum + c.points, 0);
    expect(report.score).toBe(report.maxScore - lost);
    const total = detail.body.submission.totalPoints as number;
    expect(detail.body.submission.autoScore).toBeCloseTo(((report.maxScore - lost) / report.maxScore) * total, 2);
  });
});
