/**
 * Contact and coil truth tables, IEC 61131-3:2013 clause 8.2 (contacts 8.2.4, coils 8.2.5,
 * evaluation order 8.2.7; [memory] for the sub-numbers), as docs/published-values.md summarises them: the left
 * rail is ON, series passes state on, a vertical join is the OR of its links, NO passes when its
 * variable is TRUE, NC when FALSE, edge contacts for one evaluation after a change; a coil writes the
 * left state, a negated coil its inverse, set/reset coils latch.
 */
import { describe, expect, it } from 'vitest';
import { createRuntime } from '@shared/engine';
import type { CoilVariant, ContactVariant } from '@shared/ladder/schema';
import { planOf, programBuilder } from '../unit/engine/build';

/** %IX1 (left state: feeds the contact) → contact on %IX2 → %QX1. */
function contactTable(variant: ContactVariant, previous: boolean, current: boolean, left: boolean): boolean {
  const b = programBuilder();
  const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.contact(variant, '%IX2'), b.coil('%QX1'))])));
  rt.setInput(1, true);
  rt.setInput(2, previous);
  rt.scan();
  rt.setInput(1, left);
  rt.setInput(2, current);
  rt.scan();
  return rt.getOutput(1);
}

/**
 * %IX1 (left state) → coil on %MX1. Two rungs above it bring %MX1 to `old` in the same scan (a set
 * coil on %IX3, a reset coil on %IX4), so the coil under test finds `old` when it is evaluated.
 */
function coilTable(variant: CoilVariant, old: boolean, left: boolean): boolean {
  const b = programBuilder();
  const rt = createRuntime(
    planOf(
      b.program([
        b.rung(b.no('%IX3'), b.coil('%MX1', 'set')),
        b.rung(b.no('%IX4'), b.coil('%MX1', 'reset')),
        b.rung(b.no('%IX1'), b.no('%IX2'), b.coil('%MX1', variant)),
      ]),
    ),
  );
  rt.setInputs([left, true, old, !old]);
  rt.scan();
  return rt.read('%MX1') as boolean;
}

describe('contacts (IEC 61131-3:2013 8.2.4)', () => {
  const rows: Array<[ContactVariant, boolean, boolean, boolean]> = [
    // variant, previous value, current value, passes (with the left state ON)
    ['no', false, false, false],
    ['no', true, true, true],
    ['nc', false, false, true],
    ['nc', true, true, false],
    ['rising', false, true, true],
    ['rising', true, true, false],
    ['rising', true, false, false],
    ['rising', false, false, false],
    ['falling', true, false, true],
    ['falling', false, false, false],
    ['falling', false, true, false],
    ['falling', true, true, false],
  ];
  for (const [variant, previous, current, passes] of rows) {
    it(`${variant}: ${previous ? 'TRUE' : 'FALSE'} → ${current ? 'TRUE' : 'FALSE'} ${passes ? 'passes' : 'blocks'} power`, () => {
      expect(contactTable(variant, previous, current, true)).toBe(passes);
    });
  }

  it('no contact passes power it does not receive', () => {
    for (const [variant, previous, current] of rows) expect(contactTable(variant, previous, current, false)).toBe(false);
  });
});

describe('coils (IEC 61131-3:2013 8.2.5)', () => {
  const rows: Array<[CoilVariant, boolean, boolean, boolean]> = [
    // variant, old value, left state, new value
    ['coil', false, true, true],
    ['coil', true, false, false],
    ['negated', false, false, true],
    ['negated', true, true, false],
    ['set', false, true, true],
    ['set', true, false, true],
    ['set', false, false, false],
    ['reset', true, true, false],
    ['reset', true, false, true],
    ['reset', false, false, false],
  ];
  for (const [variant, old, left, next] of rows) {
    it(`${variant}: old ${old ? 'TRUE' : 'FALSE'}, power ${left ? 'ON' : 'OFF'} → ${next ? 'TRUE' : 'FALSE'}`, () => {
      expect(coilTable(variant, old, left)).toBe(next);
    });
  }
});

describe('rails and links (IEC 61131-3:2013 8.2.2, 8.2.3, 8.2.7)', () => {
  it('the left rail is ON: a coil straight on it is always energised', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.coil('%QX1'))])));
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
  });

  it('a vertical join passes the OR of the links on its left', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.parallel(b.no('%IX1'), b.no('%IX2'), b.no('%IX3')), b.coil('%QX1'))])));
    for (let mask = 0; mask < 8; mask += 1) {
      rt.setInputs([Boolean(mask & 1), Boolean(mask & 2), Boolean(mask & 4)]);
      rt.scan();
      expect(rt.getOutput(1)).toBe(mask !== 0);
    }
  });

  it('networks are evaluated top to bottom', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(b.program([b.rung(b.no('%MX1'), b.coil('%MX2')), b.rung(b.no('%IX1'), b.coil('%MX1')), b.rung(b.no('%MX1'), b.coil('%MX3'))])),
    );
    rt.setInput(1, true);
    rt.scan();
    expect([rt.read('%MX2'), rt.read('%MX3')]).toEqual([false, true]);
  });
});
