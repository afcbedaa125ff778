/**
 * Per-user limits on expensive calls: past the limit a call answers 429 with Retry-After in
 * seconds and a sentence, nothing runs, the count lives in the database, and the window passes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { readCounter } from '../../server/db/rateCounters';
import { formatWait, USER_LIMITS } from '../../server/http/userLimits';
import { createTestApp, type TestApp } from './helpers/testApp';
import { call, createCast, createProgramAs, type Cast } from './helpers/fixtures';
import { labFromTemplate, publish, saveInCopy, submitVersion } from './labsFixtures';

let t: TestApp;
let cast: Cast;
beforeAll(async () => {
  t = await createTestApp();
  cast = await createCast(t);
}, 60_000);
afterAll(() => t.close());

describe('per-user limits on expensive calls', () => {
  it('answers the export past the limit with 429, Retry-After and how long to wait, until the window passes', async () => {
    const programId = await createProgramAs(t, cast.studentA);
    const exportAs = (cookie: string) => call(t, 'get', `/api/programs/${programId}/versions/1/export?format=json`, cookie);
    const { limit, windowMs } = USER_LIMITS.export;
    for (let i = 0; i < limit; i += 1) expect((await exportAs(cast.studentA.cookie)).status).toBe(200);
    t.clock.advance(60_000);
    const refused = await exportAs(cast.studentA.cookie);
    expect(refused.status).toBe(429);
    expect(refused.headers['retry-after']).toBe(String((windowMs - 60_000) / 1000));
    expect(refused.body.error).toEqual({
      code: 'rate_limited',
      message: `Too many exports: at most ${limit} in 5 minutes for one account. Try again in 4 min.`,
      details: { retryAfterSeconds: 240 },
    });
    // Counted in the database, where every process sharing it sees the same count.
    expect((await readCounter(t.database.orm, `export:${cast.studentA.user.id}`))?.count).toBe(limit + 1);
    // Another account has its own count: student B still exports their own program.
    const otherId = await createProgramAs(t, cast.studentB);
    expect((await call(t, 'get', `/api/programs/${otherId}/versions/1/export?format=json`, cast.studentB.cookie)).status).toBe(200);
    t.clock.advance(windowMs);
    expect((await exportAs(cast.studentA.cookie)).status).toBe(200);
  }, 60_000);

  it('limits gradings (trial runs, submissions, regrades) together, and refuses before grading', async () => {
    const { labId } = await labFromTemplate(t, cast.instructor, cast.classId, FORWARD_REVERSE.id);
    await publish(t, cast.instructor, labId);
    const ref = await saveInCopy(t, cast.studentB, labId, FORWARD_REVERSE.solution);
    const { limit } = USER_LIMITS.grading;
    // Fill the window with refused-for-other-reasons calls: they count too (the work was asked for).
    for (let i = 0; i < limit; i += 1) await call(t, 'post', `/api/labs/${labId}/try`, cast.studentB.cookie).send({ programId: ref.programId, version: ref.version });
    const before = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentB.cookie);
    const refused = await submitVersion(t, cast.studentB, labId, ref);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    const after = await call(t, 'get', `/api/labs/${labId}/submissions/mine`, cast.studentB.cookie);
    expect(after.body.submissions).toHaveLength(before.body.submissions.length);
  }, 60_000);

  it('leaves signed-out callers to the route, which answers 401', async () => {
    const res = await call(t, 'post', '/api/programs/import');
    expect(res.status).toBe(401);
  });

  it('says the wait in minutes and seconds', () => {
    expect(formatWait(40)).toBe('40 s');
    expect(formatWait(120)).toBe('2 min');
    expect(formatWait(125)).toBe('2 min 5 s');
  });
});
