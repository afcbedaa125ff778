import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { NetworkNode, Series } from '@shared/ladder/schema';
import { layoutProgram, NETWORK_X, rungsInBand } from '@/editor/layout';
import { CELL_H, CELL_W, BRANCH_PAD, LEFT_RAIL_X, MIN_RUNG_W, PIN_PITCH, RUNG_COMMENT_H, RUNG_PAD_TOP, WIRE_Y } from '@/editor/geometry';
import { coil, no, parallel, program, rung, series, threeWire, ton } from './fixtures';

const box = (layout: ReturnType<typeof layoutProgram>, id: string) => {
  for (const r of layout.rungs) {
    const found = r.elements.find((b) => b.id === id);
    if (found) return found;
  }
  throw new Error(`no box ${id}`);
};

describe('the layout of a three-wire start/stop rung', () => {
  const layout = layoutProgram(threeWire());
  const top = RUNG_PAD_TOP + RUNG_COMMENT_H; // the rung has a comment line above its network

  it('puts the stop contact first on the main wire, right after the lead-in', () => {
    expect(box(layout, 'stop')).toMatchObject({ x: NETWORK_X, y: top, width: CELL_W, height: CELL_H, wireY: top + WIRE_Y });
  });

  it('stacks the seal-in branch under the start button, both inset for the vertical links', () => {
    const parallelX = NETWORK_X + CELL_W;
    expect(box(layout, 'start')).toMatchObject({ x: parallelX + BRANCH_PAD, y: top });
    expect(box(layout, 'seal')).toMatchObject({ x: parallelX + BRANCH_PAD, y: top + CELL_H, wireY: top + CELL_H + WIRE_Y });
  });

  it('draws the vertical links of the branch at both ends, from the main wire down to the seal-in wire', () => {
    const left = NETWORK_X + CELL_W;
    const right = left + CELL_W + 2 * BRANCH_PAD;
    const rung0 = layout.rungs[0]!;
    const vertical = rung0.wires.filter((w) => w.x1 === w.x2);
    expect(vertical).toEqual(
      expect.arrayContaining([
        { x1: left, y1: top + WIRE_Y, x2: left, y2: top + CELL_H + WIRE_Y },
        { x1: right, y1: top + WIRE_Y, x2: right, y2: top + CELL_H + WIRE_Y },
      ]),
    );
  });

  it('pushes the coil against the right rail, which stands at least the minimum rung width from the left one', () => {
    expect(layout.rightRailX).toBe(LEFT_RAIL_X + MIN_RUNG_W);
    const k1 = box(layout, 'k1');
    expect(k1.x + k1.width).toBe(layout.rightRailX - 18);
  });

  it('writes the tag name above its address whichever of the two the operand names', () => {
    expect(box(layout, 'stop').label).toEqual({ primary: 'S1', secondary: '%IX1' });
    expect(box(layout, 'seal').label).toEqual({ primary: 'K1', secondary: '%QX1' });
  });

  it('offers a drop slot before, between and after every item of every series', () => {
    const keys = layout.rungs[0]!.slots.map((s) => s.key).sort();
    expect(keys).toEqual(['r1//0', 'r1//1', 'r1//2', 'r1//3', 'r1/1.0/0', 'r1/1.0/1', 'r1/1.1/0', 'r1/1.1/1'].sort());
  });

  it('lays out the same document to the same drawing every time and never writes into the document', () => {
    const doc = threeWire();
    const frozen = JSON.stringify(doc);
    expect(layoutProgram(doc)).toEqual(layoutProgram(doc));
    expect(JSON.stringify(doc)).toBe(frozen);
  });

  it('places a rung\'s drawing when first read, the same arrays on every later read, whichever rung is read first', () => {
    const doc = threeWire();
    const readFirst = layoutProgram(doc);
    const rung = readFirst.rungs[0]!;
    const { elements, wires, slots } = rung;
    expect(rung.elements).toBe(elements);
    expect(rung.wires).toBe(wires);
    expect(rung.slots).toBe(slots);
    // Read in another order (a box looked up before the wires), the drawing is the same.
    const readLater = layoutProgram(doc);
    expect(box(readLater, 'seal')).toEqual(box(readFirst, 'seal'));
    expect(readLater.rungs[0]!.wires).toEqual(wires);
    expect(readLater).toEqual(readFirst);
  });
});

describe('the layout of blocks, lone branches and empty rungs', () => {
  it('puts a timer\'s IN pin on the wire and its preset one pin pitch below, with the operand beside it', () => {
    const layout = layoutProgram(program([rung('r1', series('n', no('a', '%IX1'), ton('t', 'T1', 'T#5s'), coil('q', '%QX3')))]));
    const timer = box(layout, 't');
    const pt = timer.pins.find((p) => p.name === 'PT')!;
    const inPin = timer.pins.find((p) => p.name === 'IN')!;
    expect(inPin).toMatchObject({ y: timer.wireY, power: true, side: 'in' });
    expect(pt).toMatchObject({ y: timer.wireY + PIN_PITCH, operand: 'T#5s', power: false });
    expect(timer.pins.filter((p) => p.side === 'out').map((p) => p.name)).toEqual(['Q', 'ET']);
    expect(timer.label.primary).toBe('T1');
  });

  it('gives a lone element standing as a branch a slot on each side of it', () => {
    const layout = layoutProgram(program([rung('r1', series('n', parallel('p', no('a'), no('b')), coil('q')))]));
    const slots = layout.rungs[0]!.slots.filter((s) => s.target.path.length === 2);
    expect(slots.map((s) => s.target)).toEqual([
      { rungId: 'r1', path: [0, 0], index: 0 },
      { rungId: 'r1', path: [0, 0], index: 1 },
      { rungId: 'r1', path: [0, 1], index: 0 },
      { rungId: 'r1', path: [0, 1], index: 1 },
    ]);
  });

  it('draws an empty rung as one wire from rail to rail with one slot to drop on', () => {
    const layout = layoutProgram(program([rung('r1', series('n'))]));
    const r = layout.rungs[0]!;
    expect(r.elements).toEqual([]);
    expect(r.slots).toHaveLength(1);
    expect(r.slots[0]!.target).toEqual({ rungId: 'r1', path: [], index: 0 });
    const horizontalSpan = r.wires.filter((w) => w.y1 === r.wireY).reduce((sum, w) => sum + (w.x2 - w.x1), 0);
    expect(horizontalSpan).toBe(layout.rightRailX - (LEFT_RAIL_X + 4));
  });

  it('stacks rungs one below the other and finds the ones in a band by their extent', () => {
    const rungs = Array.from({ length: 5 }, (_, i) => rung(`r${i}`, series(`n${i}`, no(`c${i}`), coil(`q${i}`))));
    const layout = layoutProgram(program(rungs));
    layout.rungs.forEach((r, i) => {
      if (i > 0) expect(r.top).toBe(layout.rungs[i - 1]!.top + layout.rungs[i - 1]!.height);
    });
    expect(layout.height).toBe(layout.rungs.reduce((sum, r) => sum + r.height, 0));
    const second = layout.rungs[1]!;
    expect(rungsInBand(layout, second.top + 1, second.top + 2).map((r) => r.rungId)).toEqual(['r1']);
    expect(rungsInBand(layout, second.top - 1, second.top + second.height + 1).map((r) => r.rungId)).toEqual(['r0', 'r1', 'r2']);
  });

  it('moves the shared right rail out for a rung wider than the minimum', () => {
    const wide = series('w', ...Array.from({ length: 10 }, (_, i) => no(`c${i}`)), coil('q'));
    const layout = layoutProgram(program([rung('a', series('n', no('x'), coil('y'))), rung('b', wide)]));
    expect(layout.rightRailX).toBe(NETWORK_X + 11 * CELL_W + 18);
    expect(box(layout, 'y').x + CELL_W).toBe(box(layout, 'q').x + CELL_W);
  });
});

/** Random series-parallel networks with unique ids, for the geometric invariants. */
function networkArbitrary(): fc.Arbitrary<Series> {
  let counter = 0;
  const id = () => `n${(counter += 1)}`;
  const { node } = fc.letrec<{ node: NetworkNode }>((tie) => ({
    node: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      fc.constant(null).map(() => no(id())),
      fc.constant(null).map(() => ton(id(), 'T1')),
      fc.array(tie('node'), { minLength: 0, maxLength: 3 }).map((items) => series(id(), ...items)),
      fc.array(tie('node'), { minLength: 1, maxLength: 3 }).map((branches) => parallel(id(), ...branches)),
    ),
  }));
  return fc.array(node, { maxLength: 5 }).map((items) => series(id(), ...items, coil(id())));
}

describe('layout invariants over random networks', () => {
  it('never lets two element cells overlap and keeps every cell between the rails and inside its rung', () => {
    fc.assert(
      fc.property(networkArbitrary(), (network) => {
        const layout = layoutProgram(program([rung('r', network)]));
        const r = layout.rungs[0]!;
        for (const a of r.elements) {
          expect(a.x).toBeGreaterThanOrEqual(NETWORK_X);
          expect(a.x + a.width).toBeLessThanOrEqual(layout.rightRailX);
          expect(a.y + a.height).toBeLessThanOrEqual(r.networkBottom);
          for (const b of r.elements) {
            if (a === b) continue;
            const apart = a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;
            expect(apart).toBe(true);
          }
        }
        const slotKeys = r.slots.map((s) => s.key);
        expect(new Set(slotKeys).size).toBe(slotKeys.length);
      }),
      { numRuns: 200 },
    );
  });
});
