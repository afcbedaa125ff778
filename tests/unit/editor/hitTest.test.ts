import { describe, expect, it } from 'vitest';
import { layoutProgram } from '@/editor/layout';
import { elementsInRect, hitTest, nearestSlot } from '@/editor/hitTest';
import { coil, no, program, rung, series, threeWire } from './fixtures';

describe('hit-testing the drawing', () => {
  const layout = layoutProgram(threeWire());
  const r = layout.rungs[0]!;
  const seal = r.elements.find((b) => b.id === 'seal')!;

  it('finds the element whose cell is under the pointer, in program coordinates', () => {
    const hit = hitTest(layout, { x: seal.x + 5, y: r.top + seal.y + 5 });
    expect(hit).toMatchObject({ kind: 'element', rungId: 'r1', box: { id: 'seal' } });
  });

  it('reports the rung number gutter and empty rung area apart from elements', () => {
    expect(hitTest(layout, { x: 10, y: r.top + r.wireY })).toEqual({ kind: 'rung-number', rungId: 'r1' });
    expect(hitTest(layout, { x: 500, y: r.top + r.wireY })).toEqual({ kind: 'rung', rungId: 'r1' });
    expect(hitTest(layout, { x: 500, y: layout.height + 50 })).toEqual({ kind: 'nothing' });
  });

  it('catches the nearest drop slot within the catch radius and nothing beyond it', () => {
    const slot = r.slots.find((s) => s.key === 'r1//0')!;
    expect(nearestSlot(layout, { x: slot.x + 6, y: r.top + slot.y - 4 })?.key).toBe('r1//0');
    expect(nearestSlot(layout, { x: slot.x + 6, y: r.top + slot.y + 200 })).toBeUndefined();
  });

  it('finds slots in the next rung when the pointer is just above it', () => {
    const two = layoutProgram(program([rung('a', series('n1', no('x'), coil('y'))), rung('b', series('n2'))]));
    const b = two.rungs[1]!;
    const slot = b.slots[0]!;
    const found = nearestSlot(two, { x: slot.x, y: b.top - 2 }, b.slots[0]!.y + 4);
    expect(found?.target.rungId).toBe('b');
  });

  it('selects by rubber band every element a rectangle touches', () => {
    const start = r.elements.find((b) => b.id === 'start')!;
    const ids = elementsInRect(layout, { x: start.x + 1, y: r.top + start.y + 1 }, { x: seal.x + 2, y: r.top + seal.y + 2 }).map((b) => b.id);
    expect(ids.sort()).toEqual(['seal', 'start']);
  });
});
