/**
 * The wall-clock limit of the grading pool: a job that spins (test-only hook, set on the pool, not
 * reachable from HTTP) is terminated past the limit with a clear note, the worker is replaced and
 * the next job grades normally.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { builtInPanel } from '@shared/field/panels';
import { createGradingPool } from '../../server/grading/pool';

const pool = createGradingPool({ size: 1, timeoutMs: 1500, allowSpinForTests: true });
afterAll(() => pool.close());
const job = { program: FORWARD_REVERSE.solution, panel: builtInPanel('reversing-conveyor')!, script: FORWARD_REVERSE.script };

describe('grading pool', () => {
  it('terminates a spinning grading past the wall-clock limit and keeps grading afterwards', async () => {
    await pool.warm();
    const started = Date.now();
    const spun = await pool.grade(job, { spin: true });
    const took = Date.now() - started;
    expect(spun.report).toBeNull();
    expect(spun.note).toMatch(/stopped after 1.5 s of wall-clock time/);
    expect(took).toBeGreaterThanOrEqual(1400);
    const next = await pool.grade(job);
    expect(next.report?.passed).toBe(true);
    expect(pool.workersStarted()).toBe(2);
  }, 30_000);

  it('ignores the spin hook on a pool that does not allow it', async () => {
    const plain = createGradingPool({ size: 1, timeoutMs: 1500 });
    const outcome = await plain.grade(job, { spin: true });
    expect(outcome.report?.passed).toBe(true);
    await plain.close();
  }, 30_000);
});
