import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';
import { prove, type Property, type ProveResult } from '@shared/proof';
import { FORWARD_REVERSE } from '@shared/labs';
import type { ProveRequest, WarmRequest, WorkerAnswer } from '@/proof/messages';
import { createProver, type WorkerLike } from '@/proof/proverClient';
import { playable, propertyKey, summarise, verdictText, verdictTone } from '@/components/proof/runResults';

const interlock: Property = { never: { '%QX1': true, '%QX2': true } };

/** A worker that answers as the real one would, or holds the run (a long search) until told. */
function fakeWorker(hold: boolean) {
  const made: { worker: WorkerLike; terminated: boolean; requests: (ProveRequest | WarmRequest)[] }[] = [];
  const factory = () => {
    const entry = { terminated: false, requests: [] as (ProveRequest | WarmRequest)[], worker: null as unknown as WorkerLike };
    const worker: WorkerLike = {
      onmessage: null,
      onerror: null,
      terminate: () => (entry.terminated = true),
      postMessage(request) {
        entry.requests.push(request);
        if (request.type === 'warm') return;
        const send = (answer: WorkerAnswer) => worker.onmessage?.({ data: answer } as MessageEvent<WorkerAnswer>);
        send({ type: 'progress', runId: request.runId, states: 40, depth: 3 });
        if (!hold) send({ type: 'done', runId: request.runId, result: prove({ program: request.program, panel: request.panel, properties: request.properties }), ms: 5 });
      },
    };
    entry.worker = worker;
    made.push(entry);
    return worker;
  };
  return { factory, made };
}

describe('the prover client', () => {
  it('gives the worker’s verdicts, with progress on the way, in the worker the warm-up started', async () => {
    const fake = fakeWorker(false);
    const prover = createProver(fake.factory);
    prover.warm({ program: { ...FORWARD_REVERSE.solution, rungs: [] }, panel: REVERSING_CONVEYOR, properties: [interlock] });
    const seen: number[] = [];
    const outcome = await prover.run({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [interlock] }, (p) => seen.push(p.states));
    expect(seen).toEqual([40]);
    expect(fake.made).toHaveLength(1);
    expect(fake.made[0]!.requests.map((r) => r.type)).toEqual(['warm', 'prove']);
    const summary = summarise([interlock], outcome);
    expect(summary.kind).toBe('done');
    if (summary.kind === 'done') {
      const r = summary.results.get(propertyKey(interlock))!;
      expect(r.verdict).toBe('proved');
      expect(verdictTone(r, interlock)).toBe('holds');
      expect(summary.abstractions.length).toBeGreaterThan(0);
    }
  });

  it('Stop ends the run at once: the worker is terminated, the verdict is unknown, never proved, and the next run gets a fresh worker', async () => {
    const fake = fakeWorker(true);
    const prover = createProver(fake.factory);
    const running = prover.run({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [interlock] });
    expect(prover.running).toBe(true);
    prover.stop();
    const outcome = await running;
    expect(outcome).toEqual({ kind: 'stopped', progress: { states: 40, depth: 3 } });
    expect(fake.made[0]!.terminated).toBe(true);
    const summary = summarise([interlock], outcome);
    if (summary.kind !== 'done') throw new Error('expected results');
    const r = summary.results.get(propertyKey(interlock))!;
    expect(r.verdict).toBe('unknown');
    expect(r.reason).toMatch(/^stopped by you after 40 states/);
    expect(verdictText(r)).toBe('Unknown');
    void prover.run({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [interlock] });
    expect(fake.made).toHaveLength(2);
  });

  it('shows a counterexample that did not replay as a fault of the prover, never as playable', () => {
    const r = { label: 'x', verdict: 'unknown' as const, states: 3, transitions: 3, depth: 1, defect: true, reason: 'defect: …', counterexample: { panel: 'p', scanMs: 10, settleMs: 0, steps: [] } };
    expect(verdictText(r)).toBe('Prover fault');
    expect(verdictTone(r, interlock)).toBe('fault');
    expect(playable(r)).toBe(false);
  });

  it('names the properties it refuses, so the others can be asked alone', () => {
    const unknownName: Property = { never: { NOPE: true }, label: 'a name this program lacks' };
    const offPanel: Property = { never: { '%QX99': true }, label: 'an output the panel lacks' };
    const properties = [interlock, unknownName, offPanel];
    const refused = prove({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [interlock, unknownName] });
    if (refused.ok) throw new Error('expected a refusal');
    expect(refused.refusedProperties).toEqual([1]);
    expect(refused.errors).toEqual(['property 2 (a name this program lacks): "NOPE" names nothing in this program or on panel reversing-conveyor']);
    const both = prove({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties });
    if (both.ok) throw new Error('expected a refusal');
    expect(both.refusedProperties).toEqual([1, 2]);
    expect(both.errors.map((e) => e.slice(0, 10))).toEqual(['property 2', 'property 3']);
    const outcome = (result: ProveResult) => ({ kind: 'done' as const, answer: { type: 'done' as const, runId: 1, ms: 1, result } });
    expect(summarise(properties, outcome(both))).toEqual({ kind: 'refused', errors: both.errors, only: [1, 2] });
    // Every property refused: nothing is left to ask.
    expect(summarise([offPanel], outcome(prove({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [offPanel] })))).toMatchObject({ kind: 'refused' });
    expect(summarise([offPanel], outcome(prove({ program: FORWARD_REVERSE.solution, panel: REVERSING_CONVEYOR, properties: [offPanel] })))).not.toHaveProperty('only');
  });

  it('passes on what the prover refused, in its words', () => {
    const outcome = { kind: 'done' as const, answer: { type: 'done' as const, runId: 1, ms: 1, result: { ok: false as const, errors: ['property 1: "K9" names nothing'] } } };
    expect(summarise([interlock], outcome)).toEqual({ kind: 'refused', errors: ['property 1: "K9" names nothing'] });
  });
});

describe('how long a counterexample is', () => {
  it('counts its steps and its virtual time, waits and windows alike', async () => {
    const { scriptLength } = await import('@/components/proof/runResults');
    expect(scriptLength({ panel: 'p', scanMs: 10, settleMs: 0, steps: [{ press: 'S2' }, { wait: 10 }, { expect: { K1: 'closed' } }] })).toBe('3 steps, 10 ms');
    expect(scriptLength({ panel: 'p', scanMs: 10, settleMs: 0, steps: [{ press: 'S1' }, { wait: 20 }, { during: 100, never: { K1: 'open' } }] })).toBe('3 steps, 120 ms');
  });
});
