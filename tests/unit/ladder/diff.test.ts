import { describe, expect, it } from 'vitest';
import { diffPrograms } from '@shared/ladder/diff';
import { addRung, deleteRung, renameTag, setOperand, setRungComment } from '@shared/ladder/edits';
import { CONVEYOR_TAGS, coil, no, program, rung } from './fixtures';

const base = () =>
  program([rung('r1', no('a', 'S2'), coil('k1', 'K1')), rung('r2', no('b', 'S3'), coil('k2', 'K2')), rung('r3', no('c', 'B1'), coil('k3', 'H1'))], CONVEYOR_TAGS);

describe('diffPrograms', () => {
  it('marks every rung the same for identical programs', () => {
    expect(diffPrograms(base(), base()).map((d) => d.kind)).toEqual(['same', 'same', 'same']);
  });

  it('shows a changed rung with its text before and after', () => {
    const after = setOperand(base(), { elementId: 'b', operand: 'S4' });
    expect(diffPrograms(base(), after)[1]).toEqual({ kind: 'changed', rungId: 'r2', before: 'S3 -> K2', after: 'S4 -> K2', changedParts: ['logic'] });
  });

  it('lists an added rung where it now stands and a removed one where it stood', () => {
    let after = deleteRung(base(), { rungId: 'r2' });
    after = addRung(after, { afterRungId: 'r3', rung: rung('r9', no('d', 'S1'), coil('k9', 'P1')) });
    expect(diffPrograms(base(), after).map((d) => [d.kind, d.rungId])).toEqual([
      ['same', 'r1'],
      ['removed', 'r2'],
      ['same', 'r3'],
      ['added', 'r9'],
    ]);
    expect(diffPrograms(base(), after)[1]!.before).toBe('S3 -> K2');
  });

  it('counts a comment change and a tag rename as changes', () => {
    const commented = setRungComment(base(), { rungId: 'r1', comment: 'forward' });
    expect(diffPrograms(base(), commented)[0]).toEqual({ kind: 'changed', rungId: 'r1', before: 'S2 -> K1', after: 'S2 -> K1', afterComment: 'forward', changedParts: ['comment'] });
    const renamed = renameTag(base(), { from: 'S2', to: 'Forward' });
    expect(diffPrograms(base(), renamed)[0]).toMatchObject({ kind: 'changed', before: 'S2 -> K1', after: 'Forward -> K1', changedParts: ['logic'] });
  });

  it('says when both the logic and the comment of a rung changed', () => {
    const both = setRungComment(setOperand(base(), { elementId: 'a', operand: 'S3' }), { rungId: 'r1', comment: 'now reverse' });
    expect(diffPrograms(base(), both)[0]).toMatchObject({ kind: 'changed', changedParts: ['logic', 'comment'], afterComment: 'now reverse' });
  });
});
