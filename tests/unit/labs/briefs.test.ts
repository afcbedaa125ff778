import { describe, expect, it } from 'vitest';
import { parseCheckScript } from '@shared/checks';
import { builtInPanel } from '@shared/field';
import { SAFETY_CAUTION, STANDARD_LABS, standardLab } from '@shared/labs';
import { ProgramSchema, validateProgram } from '@shared/ladder';

describe('the standard course', () => {
  it('lists the seven labs in teaching order with unique ids', () => {
    expect(STANDARD_LABS.map((l) => l.id)).toEqual(['io-checkout', 'two-wire', 'three-wire', 'jog-run', 'forward-reverse', 'warning-horn', 'box-counter']);
    expect(STANDARD_LABS.map((l) => l.order)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(standardLab('three-wire')?.title).toBe('Three-wire start/stop with a seal-in');
    expect(standardLab('nope')).toBeUndefined();
  });

  it.each(STANDARD_LABS.map((l) => [l.id, l] as const))('%s: brief in the demo scenario with the safety caution', (_id, lab) => {
    expect(lab.brief.startsWith('# ')).toBe(true);
    expect(lab.brief).toContain('Demo scenario — Larch Hollow Timber Co. (invented)');
    expect(lab.brief).toContain(SAFETY_CAUTION);
    for (const standard of ['OSHA 29 CFR 1910.147', 'CSA Z460', 'NFPA 70E', 'CSA Z462', 'NFPA 79', 'IEC 60204-1', 'ISO 13850']) {
      expect(lab.brief).toContain(standard);
    }
  });

  it.each(STANDARD_LABS.map((l) => [l.id, l] as const))('%s: valid documents, a known panel and a valid script', (_id, lab) => {
    expect(builtInPanel(lab.panel)).toBeDefined();
    for (const program of [lab.starter, lab.solution]) {
      expect(ProgramSchema.safeParse(program).success).toBe(true);
      expect(validateProgram(program).filter((d) => d.severity === 'error')).toEqual([]);
    }
    expect(parseCheckScript(lab.script).ok).toBe(true);
  });
});
