import { describe, expect, it } from 'vitest';
import { createTraceBuffer } from '@/simulation/traceBuffer';

describe('the trace ring buffer', () => {
  it('keeps only the last window of virtual time', () => {
    const trace = createTraceBuffer({ capacity: 10_000, windowMs: 1000 });
    trace.setSignals(['A']);
    for (let t = 10; t <= 3000; t += 10) trace.record(t, () => t % 20 === 0);
    const { times, columns } = trace.window(['A']);
    expect(times[0]).toBe(2000);
    expect(times.at(-1)).toBe(3000);
    expect(columns[0]!.slice(0, 2)).toEqual([1, 0]);
  });

  it('overwrites the oldest rows when the capacity is reached', () => {
    const trace = createTraceBuffer({ capacity: 5, windowMs: 1e9 });
    trace.setSignals(['N']);
    for (let t = 1; t <= 12; t += 1) trace.record(t, () => t * 2);
    expect(trace.length).toBe(5);
    expect(trace.window(['N'])).toEqual({ times: [8, 9, 10, 11, 12], columns: [[16, 18, 20, 22, 24]] });
  });

  it('starts a newly picked signal empty and keeps the history of signals kept', () => {
    const trace = createTraceBuffer({ capacity: 100, windowMs: 1e9 });
    trace.setSignals(['A']);
    trace.record(10, () => true);
    trace.setSignals(['A', 'T1.ET']);
    trace.record(20, (s) => (s === 'A' ? false : 40));
    const w = trace.window(['A', 'T1.ET', 'missing']);
    expect(w.columns[0]).toEqual([1, 0]);
    expect(w.columns[1]![0]).toBeNaN();
    expect(w.columns[1]![1]).toBe(40);
    expect(w.columns[2]!.every(Number.isNaN)).toBe(true);
  });

  it('selects a time range and exports CSV with empty cells for nothing recorded', () => {
    const trace = createTraceBuffer({ capacity: 100, windowMs: 1e9 });
    trace.setSignals(['%IX1', 'T1.ET']);
    for (let t = 10; t <= 50; t += 10) trace.record(t, (s) => (s === '%IX1' ? t >= 30 : t === 10 ? undefined : t));
    expect(trace.window(['%IX1'], 20, 40).times).toEqual([20, 30, 40]);
    expect(trace.toCSV(['%IX1', 'T1.ET']).split('\n').slice(0, 3)).toEqual(['time_ms,%IX1,T1.ET', '10,0,', '20,0,20']);
  });
});

describe('structural sharing of views', () => {
  it('keeps the previous object for an unchanged item and the previous array when nothing changed', async () => {
    const { shareByKey, sameData } = await import('@/simulation/sharing');
    const before = [{ id: 'K1', word: 'open', detail: { moving: false } }, { id: 'K2', word: 'open', detail: { moving: false } }];
    const next = [{ id: 'K1', word: 'open', detail: { moving: false } }, { id: 'K2', word: 'closed', detail: { moving: false } }];
    const shared = shareByKey(before, next, (d) => d.id);
    expect(shared[0]).toBe(before[0]);
    expect(shared[1]).toBe(next[1]);
    const again = shareByKey(shared, structuredClone(shared), (d) => d.id);
    expect(again).toBe(shared);
    expect(sameData({ a: [1, { b: 2 }] }, { a: [1, { b: 3 }] })).toBe(false);
  });
});
