/**
 * Regrade sends a lab's submissions to the grader concurrently, never more than
 * `REGRADE_CONCURRENCY` at once, and every submission ends graded with its old report in history.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { createGradingPool, type Grader } from '../../server/grading/pool';
import { REGRADE_CONCURRENCY } from '../../server/services/submissions';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';

const SUBMISSIONS = 7;
const pool = createGradingPool({ size: 2 });
let inFlight = 0;
let mostInFlight = 0;
/** The real pool, counting how many gradings are asked for at the same time. */
const counting: Grader = {
  async grade(job) {
    inFlight += 1;
    mostInFlight = Math.max(mostInFlight, inFlight);
    try {
      return await pool.grade(job);
    } finally {
      inFlight -= 1;
    }
  },
  close: () => pool.close(),
};

let t: TestApp;
let cast: Cast;
let labId: string;
beforeAll(async () => {
  t = await createTestApp({}, { grader: counting });
  cast = await createCast(t);
  ({ labId } = await labFromTemplate(t, cast.instructor, cast.classId, FORWARD_REVERSE.id));
  await publish(t, cast.instructor, labId);
  const ref = await saveInCopy(t, cast.studentA, labId, FORWARD_REVERSE.solution);
  for (let i = 0; i < SUBMISSIONS; i += 1) expect((await submitVersion(t, cast.studentA, labId, ref)).status).toBe(201);
}, 90_000);
afterAll(() => t.close());

describe('regrade', () => {
  it('grades the submissions several at a time, within the bound, and keeps every old report', async () => {
    // The submissions above were sent one after another.
    expect(mostInFlight).toBe(1);
    const res = await call(t, 'post', `/api/labs/${labId}/regrade`, cast.instructor.cookie).send({});
    expect(res.status, res.text).toBe(200);
    expect(res.body).toEqual({ regraded: SUBMISSIONS, limited: 0 });
    expect(mostInFlight).toBeGreaterThan(1);
    expect(mostInFlight).toBeLessThanOrEqual(REGRADE_CONCURRENCY);
    const list = await call(t, 'get', `/api/labs/${labId}/submissions`, cast.instructor.cookie);
    expect(list.body.submissions).toHaveLength(SUBMISSIONS);
    for (const row of list.body.submissions) {
      const detail = await call(t, 'get', `/api/submissions/${row.id}`, cast.instructor.cookie);
      expect(detail.body.submission).toMatchObject({ status: 'graded', autoScore: detail.body.submission.totalPoints });
      expect(detail.body.submission.history).toHaveLength(1);
    }
  }, 60_000);
});
