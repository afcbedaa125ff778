import { describe, expect, it } from 'vitest';
import { THREE_WIRE } from '@shared/labs';
import { factLines, rungLines } from '@/components/print/printModel';

const when = (iso: string) => `at ${iso.slice(0, 10)}`;

describe('what a printed sheet says about itself', () => {
  it('names the student, class, lab, version with its date and the printing date, leaving out the unknown', () => {
    expect(
      factLines({ title: 'x', student: 'Ana Reyes', className: 'Motor Control 1', lab: 'Three-wire', version: 3, savedAt: '2026-10-01T10:00:00Z', printedAt: '2026-10-02T08:00:00Z' }, when),
    ).toEqual([
      { label: 'Student', value: 'Ana Reyes' },
      { label: 'Class', value: 'Motor Control 1' },
      { label: 'Lab', value: 'Three-wire' },
      { label: 'Version', value: '3, saved at 2026-10-01' },
      { label: 'Printed', value: 'at 2026-10-02' },
    ]);
    expect(factLines({ title: 'x', student: null, className: null, lab: null, version: null, savedAt: null, printedAt: '2026-10-02T08:00:00Z' }, when)).toEqual([{ label: 'Printed', value: 'at 2026-10-02' }]);
  });

  it('writes each rung as its numbered text form with the tag names', () => {
    const lines = rungLines(THREE_WIRE.solution);
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatchObject({ number: 1, text: expect.stringContaining('Stop_PB') });
    expect(lines[0]!.comment).toMatch(/Three-wire/);
  });
});
