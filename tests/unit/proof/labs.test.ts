/**
 * Each standard lab's safety properties: proved for the reference solution, refuted for a typical
 * wrong answer, and the counterexample, run through the command line's `check`, exits 0 (the
 * violation reproduces on the simulator).
 */
import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab, STANDARD_LABS } from '@shared/labs';
import { prove } from '@shared/proof';
import type { CliIO } from '../../../server/cli/io';
import { cliMain } from '../../../server/cli/main';
import { MISTAKES } from '../labs/mistakes';
import { LAB_CASES as CASES } from './labProperties';

/** Run the command line's `check` on a program and a script held in memory. */
function checkExit(program: unknown, script: unknown): { code: number; out: string } {
  const files: Record<string, string> = { 'p.json': JSON.stringify(program), 's.json': JSON.stringify(script) };
  const out: string[] = [];
  const io: CliIO = {
    readFile: (p) => (Object.hasOwn(files, p) ? { ok: true, value: files[p]! } : { ok: false, error: `${p}: no such file` }),
    writeFile: () => ({ ok: true, value: undefined }),
    stdout: (t) => void out.push(t),
    stderr: (t) => void out.push(t),
  };
  const code = cliMain(['check', '--program', 'p.json', '--script', 's.json'], io);
  return { code, out: out.join('') };
}

describe('the standard labs under proof', () => {
  it('covers every standard lab', () => {
    expect(new Set(CASES.map((c) => c.lab))).toEqual(new Set(STANDARD_LABS.map((l) => l.id)));
  });

  it.each(CASES.map((c) => [c.lab, c.mistake, c] as const))('%s: the reference proves its safety properties; "%s" is refuted', (_lab, _mistake, c) => {
    const lab = standardLab(c.lab)!;
    const reference = prove({ program: lab.solution, panel: REVERSING_CONVEYOR, properties: c.properties });
    if (!reference.ok) throw new Error(reference.errors.join('\n'));
    expect(reference.results.map((r) => [r.label, r.verdict])).toEqual(c.properties.map((_, i) => [reference.results[i]!.label, 'proved']));

    const mistake = MISTAKES.find((m) => m.lab === c.lab && m.name === c.mistake)!;
    const wrong = prove({ program: mistake.program, panel: REVERSING_CONVEYOR, properties: c.properties });
    if (!wrong.ok) throw new Error(wrong.errors.join('\n'));
    const refuted = wrong.results.find((r) => r.label === c.refutes)!;
    expect(refuted.verdict).toBe('refuted');
    expect(refuted.defect).toBeUndefined();
    // The counterexample reproduces through the ordinary command line: every step passes.
    const run = checkExit(mistake.program, refuted.counterexample);
    expect(run.code, run.out).toBe(0);
    // …and the same script fails on the reference solution: it catches exactly the wrong answer.
    expect(checkExit(lab.solution, refuted.counterexample).code).toBe(1);
  });
});
