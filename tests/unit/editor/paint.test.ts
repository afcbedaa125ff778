// @vitest-environment happy-dom
import 'vitest-canvas-mock';
import { describe, expect, it } from 'vitest';
import type { Context } from 'konva/lib/Context';
import { block, buildProgram, coil, no, par, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import { rungOps } from '@/editor/drawList';
import { layoutProgram } from '@/editor/layout';
import { paintOps } from '@/components/editor/paint';
import { LIGHT_PALETTE, MIN_CANVAS_TEXT_PX } from '@/theme';

/** A scene context that only records the fonts it is given. */
function fontRecorder(): { ctx: Context; sizes: number[] } {
  const sizes: number[] = [];
  const ctx = {
    setAttr: (name: string, value: unknown) => {
      if (name === 'font') sizes.push(Number(/(\d+(?:\.\d+)?)px/.exec(String(value))?.[1]));
    },
    measureText: (text: string) => ({ width: text.length * 6 }),
    beginPath: () => undefined,
    moveTo: () => undefined,
    lineTo: () => undefined,
    stroke: () => undefined,
    arc: () => undefined,
    fillRect: () => undefined,
    strokeRect: () => undefined,
    fillText: () => undefined,
  } as unknown as Context;
  return { ctx, sizes };
}

describe('painting the rungs', () => {
  // Addresses, element comments and a block's pin names, the smallest text a rung has.
  const program = buildProgram('Text sizes', '', conveyorTags(), [
    rung('Seal-in', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
    rung('Jam timer', no('Box_Eye'), block('TON', 'T1', { PT: 'T#5s' })),
  ]);
  const layout = layoutProgram({ ...program, rungs: program.rungs.map((r) => ({ ...r, network: { ...r.network } })) });
  const ops = layout.rungs.flatMap((r) => rungOps(r, layout));
  const asked = ops.flatMap((op) => (op.op === 'text' ? [op.size] : []));

  it('is asked for text smaller than 11 px by the draw list (so the floor below is what keeps it legible)', () => {
    expect(Math.min(...asked)).toBeLessThan(MIN_CANVAS_TEXT_PX);
  });

  it('never paints text below 11 px (docs/names-and-rules.md: canvas text is never smaller than 11 px; the canvas never zooms below 1)', () => {
    const { ctx, sizes } = fontRecorder();
    paintOps(ctx, ops, LIGHT_PALETTE);
    expect(sizes).toHaveLength(asked.length);
    expect(Math.min(...sizes)).toBe(MIN_CANVAS_TEXT_PX);
    // Larger text keeps its own size.
    expect(Math.max(...sizes)).toBe(Math.max(...asked));
  });
});
