import { describe, expect, it } from 'vitest';
import { layoutProgram } from '@/editor/layout';
import { moveSelection } from '@/editor/navigation';
import { NO_SELECTION, selectElements, selectSlot, type Selection } from '@/editor/selection';
import { coil, no, program, rung, series, threeWire } from './fixtures';

const walk = (layout: ReturnType<typeof layoutProgram>, from: Selection, keys: Array<'left' | 'right' | 'up' | 'down'>) =>
  keys.reduce((sel, key) => moveSelection(layout, sel, key), from);

describe('arrow-key navigation over the drawing', () => {
  const layout = layoutProgram(threeWire());

  it('starts at the first slot of the first rung when nothing is selected', () => {
    expect(moveSelection(layout, NO_SELECTION, 'right')).toEqual(selectSlot({ rungId: 'r1', path: [], index: 0 }));
  });

  it('walks right along the wire through slots and elements in turn', () => {
    const first = selectSlot({ rungId: 'r1', path: [], index: 0 });
    expect(walk(layout, first, ['right'])).toEqual(selectElements(['stop']));
    expect(walk(layout, first, ['right', 'right'])).toEqual(selectSlot({ rungId: 'r1', path: [], index: 1 }));
    expect(walk(layout, first, ['right', 'right', 'right', 'right'])).toEqual(selectElements(['start']));
  });

  it('moves down from the start button to the seal-in contact below it, and back up', () => {
    expect(moveSelection(layout, selectElements(['start']), 'down')).toEqual(selectElements(['seal']));
    expect(moveSelection(layout, selectElements(['seal']), 'up')).toEqual(selectElements(['start']));
  });

  it('keeps the selection at the end of a rung when there is nothing further right', () => {
    const last = selectSlot({ rungId: 'r1', path: [], index: 3 });
    expect(moveSelection(layout, last, 'right')).toEqual(last);
  });

  it('crosses into the next rung going down', () => {
    const two = layoutProgram(program([rung('a', series('n1', no('x'), coil('y'))), rung('b', series('n2', no('z'), coil('w')))]));
    expect(moveSelection(two, selectElements(['x']), 'down')).toEqual(selectElements(['z']));
  });
});
