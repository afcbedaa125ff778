import { describe, expect, it } from 'vitest';
import { CheckScriptSchema } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab } from '@shared/labs';
import { prove, type Property } from '@shared/proof';

const horn = standardLab('warning-horn')!.solution;
const NEVER_BOTH: Property = { never: { '%QX1': true, '%QX2': true } };

describe('a cut search never claims a proof', () => {
  it('says unknown, why and how far it got, at a scan budget', () => {
    const result = prove({ program: horn, panel: REVERSING_CONVEYOR, properties: [NEVER_BOTH], maxScans: 100 });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    expect(result.results[0]).toMatchObject({ verdict: 'unknown' });
    expect(result.results[0]!.reason).toMatch(/^limit of 100 simulated scans reached after \d+ states; every behaviour up to \d+ scans \(\d+ ms\) from power-up was explored without a counterexample$/);
  });

  it('says unknown when the caller stops it, and proves the same property when left to finish', () => {
    const stopped = prove({ program: horn, panel: REVERSING_CONVEYOR, properties: [NEVER_BOTH], shouldStop: (p) => p.states > 100 });
    if (!stopped.ok) throw new Error(stopped.errors.join('\n'));
    expect(stopped.results[0]!.verdict).toBe('unknown');
    expect(stopped.results[0]!.reason).toMatch(/^stopped after/);
    const finished = prove({ program: horn, panel: REVERSING_CONVEYOR, properties: [NEVER_BOTH] });
    expect(finished.ok && finished.results[0]!.verdict).toBe('proved');
  });

  it('ends at the first witness, well inside a small budget', () => {
    const result = prove({ program: horn, panel: REVERSING_CONVEYOR, properties: [{ reachable: { H1: 'sounding' } }], maxStates: 20 });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    expect(result.results[0]).toMatchObject({ verdict: 'reached', depth: 0 });
    expect(result.results[0]!.counterexample!.steps).toEqual([{ press: 'S2' }, { wait: 10 }, { expect: { H1: 'sounding' }, label: 'reached: reachable H1 sounding' }]);
  });

  it('keeps a counterexample a valid check script when the property’s label is as long as a label may be', () => {
    const long = 'K1 and K2 '.repeat(20); // 200 characters
    const result = prove({ program: standardLab('forward-reverse')!.solution, panel: REVERSING_CONVEYOR, properties: [{ reachable: { K1: 'closed' }, label: long }] });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    const script = result.results[0]!.counterexample!;
    expect(CheckScriptSchema.safeParse(script).success).toBe(true);
    expect(script.title).toHaveLength(200);
    expect(script.title!.endsWith('…')).toBe(true);
  });
});
