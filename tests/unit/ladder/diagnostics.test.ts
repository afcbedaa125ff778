import { describe, expect, it } from 'vitest';
import { DIAGNOSTICS, createDiagnostic, hasErrors } from '@shared/ladder/diagnostics';

describe('the diagnostic table', () => {
  it('gives every code a severity, a title and a message', () => {
    for (const [code, entry] of Object.entries(DIAGNOSTICS)) {
      expect(['error', 'warning'], code).toContain(entry.severity);
      expect(entry.title.length, code).toBeGreaterThan(3);
    }
  });

  it('builds a located diagnostic from a code and its parameters', () => {
    const d = createDiagnostic('timer-preset-missing', { name: 'T1' }, { rungId: 'r1', path: [2], elementId: 'b1', field: 'PT' });
    expect(d).toEqual({
      code: 'timer-preset-missing',
      rungId: 'r1',
      path: [2],
      elementId: 'b1',
      severity: 'error',
      message: 'timer T1 has no preset time: set PT, e.g. T#3s',
      field: 'PT',
    });
    expect(createDiagnostic('empty-rung', {}, { rungId: 'r1' })).toMatchObject({ path: [], elementId: null });
    expect(createDiagnostic('empty-rung', {}, { rungId: 'r1' })).not.toHaveProperty('field');
  });

  it('tells errors from warnings', () => {
    const warning = createDiagnostic('instance-called-twice', { name: 'T1', firstRung: 1 }, { rungId: 'r2' });
    expect(hasErrors([warning])).toBe(false);
    expect(hasErrors([warning, createDiagnostic('empty-rung', {}, { rungId: 'r1' })])).toBe(true);
  });
});
