/**
 * The wall-clock limit through HTTP: a submission whose grading never ends (the pool's test-only
 * spin hook, injected here as the app's grader; a production pool ignores it) answers within the
 * limit plus a little, stored and graded 0 with a note that says grading stopped after 5 s.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { createGradingPool, GRADING_TIMEOUT_MS, type Grader } from '../../server/grading/pool';
import { createTestApp, type TestApp } from './helpers/testApp';
import { createCast, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';

const pool = createGradingPool({ size: 1, allowSpinForTests: true });
/** Every grading spins: the stand-in for a program or script that runs away. */
const spinning: Grader = { grade: (job) => pool.grade(job, { spin: true }), close: () => pool.close() };

let t: TestApp;
let cast: Cast;
let labId: string;
beforeAll(async () => {
  t = await createTestApp({}, { grader: spinning });
  cast = await createCast(t);
  ({ labId } = await labFromTemplate(t, cast.instructor, cast.classId, FORWARD_REVERSE.id));
  await publish(t, cast.instructor, labId);
  await pool.warm();
}, 60_000);
afterAll(() => t.close());

describe('a grading past the wall-clock limit, through HTTP', () => {
  it('answers promptly with the submission stored and a note that grading stopped after 5 s', async () => {
    const ref = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution);
    const started = Date.now();
    const res = await submitVersion(t, cast.studentA, labId, ref);
    const took = Date.now() - started;
    expect(res.status, res.text).toBe(201);
    expect(res.body.submission).toMatchObject({ status: 'graded', autoScore: 0, report: null });
    expect(res.body.submission.gradingNote).toMatch(/Grading stopped after 5 s of wall-clock time/);
    expect(took).toBeGreaterThanOrEqual(GRADING_TIMEOUT_MS - 100);
    // Generous for a loaded machine; without the limit the request would never answer.
    expect(took).toBeLessThan(GRADING_TIMEOUT_MS + 5000);
  }, 30_000);
});
