import { describe, expect, it } from 'vitest';
import { runChecks } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab, STANDARD_LABS } from '@shared/labs';
import { MISTAKES } from './mistakes';

describe('typical wrong answers fail the checks a teacher expects', () => {
  it.each(MISTAKES.map((m) => [m.lab, m.name, m] as const))('%s: %s', (_lab, _name, mistake) => {
    const lab = standardLab(mistake.lab)!;
    const result = runChecks({ program: mistake.program, panel: REVERSING_CONVEYOR, script: lab.script });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    expect(result.report.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const failed = result.report.checks.filter((c) => !c.passed).map((c) => c.label);
    expect(failed).toEqual(mistake.fails);
  });

  it('covers every lab with at least two wrong answers', () => {
    for (const lab of STANDARD_LABS) expect(MISTAKES.filter((m) => m.lab === lab.id).length).toBeGreaterThanOrEqual(2);
  });
});
