import { describe, expect, it } from 'vitest';
import { FORWARD_REVERSE } from '@shared/labs';
import { labRun } from '../../../server/services/labChecks';

const panel = { kind: 'builtIn', id: 'reversing-conveyor' } as const;

describe('labRun', () => {
  it('checks a lab once and answers the same run for the same text', () => {
    const first = labRun(panel, structuredClone(FORWARD_REVERSE.script));
    const again = labRun(panel, structuredClone(FORWARD_REVERSE.script));
    expect(first.ok).toBe(true);
    expect(again).toBe(first);
  });

  it('checks an edited script afresh', () => {
    const edited = structuredClone(FORWARD_REVERSE.script) as { steps: unknown[] };
    edited.steps = [...edited.steps, { press: 'S9' }];
    const run = labRun(panel, edited);
    expect(run.ok).toBe(false);
    expect(run.ok ? null : run.part).toBe('script');
    expect(run.ok ? '' : run.failure.message).toContain('S9');
  });

  it('names the panel when the panel is what is wrong', () => {
    const run = labRun({ kind: 'builtIn', id: 'no-such-panel' }, FORWARD_REVERSE.script);
    expect(run.ok ? null : run.part).toBe('panel');
  });
});
