import { describe, expect, it } from 'vitest';
import { runChecks, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { STANDARD_LABS, type Lab } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';

function grade(lab: Lab, program: Program): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: lab.script });
  if (!result.ok) throw new Error(`${lab.id}: ${result.errors.join('\n')}`);
  return result.report;
}

const failing = (report: GradeReport): string[] => report.checks.filter((c) => !c.passed).map((c) => c.label);

describe.each(STANDARD_LABS.map((lab) => [lab.id, lab] as const))('lab %s', (_id, lab) => {
  it('passes every check with its reference solution', () => {
    const report = grade(lab, lab.solution);
    expect(report.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(failing(report), JSON.stringify(report.checks.filter((c) => !c.passed), null, 1)).toEqual([]);
    expect(report.passed).toBe(true);
    expect(report.score).toBe(report.maxScore);
  });

  it('fails some checks with its starter program', () => {
    const report = grade(lab, lab.starter);
    expect(report.passed).toBe(false);
    expect(failing(report).length).toBeGreaterThan(0);
  });

  it('has visible and hidden checks', () => {
    const report = grade(lab, lab.solution);
    expect(report.checks.some((c) => c.hidden)).toBe(true);
    expect(report.checks.some((c) => !c.hidden)).toBe(true);
  });
});
