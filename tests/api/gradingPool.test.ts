/**
 * The wall-clock limit of the grading pool: a job that spins (test-only hook, set on the pool, not
 * reachable from HTTP) is terminated past the limit with a clear note, the worker is replaced and
 * the next job grades normally.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { builtInPanel } from '@shared/field/panels';
import { createGradingPool } from '../../server/grading/pool';
import { createTestApp } from './helpers/testApp';
import { documentWithRungs } from './helpers/fixtures';

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

describe('exports and imports in the pool', () => {
  it('exports off the main thread, and stops an export past the wall-clock limit with a clear refusal', async () => {
    const quick = createGradingPool({ size: 1, timeoutMs: 200 });
    const exportOf = (rungs: number) =>
      quick.exportProgram({ documentJson: JSON.stringify(documentWithRungs(rungs)), title: 'Plant', version: 1, format: 'plcopen', now: '2026-09-01T08:00:00.000Z' });
    await quick.warm();
    // 5,000 rungs take over a second of CPU (tests/perf/health.bench.ts), far past 200 ms.
    const stopped = await exportOf(5000);
    expect(stopped).toEqual({ ok: false, failure: { code: 'processing_limit', message: 'Exporting stopped after 0.2 s of wall-clock time: the program is too large to export.' } });
    const small = await exportOf(2);
    expect(small.ok && small.value.fileName).toBe('plant-v1.xml');
    const imported = await quick.importProgram({ xml: small.ok ? new TextDecoder().decode(small.value.body) : '', fileName: 'plant.xml' });
    expect(imported.ok && imported.value.program.rungs).toHaveLength(2);
    await quick.close();
    expect((await exportOf(2)).ok).toBe(false);
  }, 30_000);
});

describe('grading pool shutdown', () => {
  it('answers a queued job with a note and leaves no worker thread running', async () => {
    const closing = createGradingPool({ size: 2 });
    await closing.warm();
    expect(closing.workersRunning()).toBe(2);
    const pending = Array.from({ length: 4 }, () => closing.grade(job));
    await closing.close();
    expect(closing.workersRunning()).toBe(0);
    const outcomes = await Promise.all(pending);
    // Graded before the close, or told to submit again; never left hanging.
    for (const o of outcomes) expect(o.report !== null || /shutting down/.test(o.note ?? '')).toBe(true);
    expect(outcomes.some((o) => o.report === null)).toBe(true);
    expect((await closing.grade(job)).note).toMatch(/shutting down/);
  }, 30_000);

  it('the test app closes the pool it made', async () => {
    const app = await createTestApp();
    const pool = app.grader as ReturnType<typeof createGradingPool>;
    await pool.warm();
    expect(pool.workersRunning()).toBeGreaterThan(0);
    await app.close();
    expect(pool.workersRunning()).toBe(0);
  }, 30_000);
});
