import { describe, expect, it } from 'vitest';
import { programText, rungText } from '@shared/ladder/text';
import { CONVEYOR_TAGS, block, coil, falling, nc, no, parallel, program, rising, rung, series, threeWireForward } from './fixtures';
import type { NetworkNode } from '@shared/ladder/schema';

const one = (...items: NetworkNode[]) => {
  const doc = program([rung('r1', ...items)], CONVEYOR_TAGS);
  return rungText(doc.rungs[0]!, doc);
};

describe('rungText', () => {
  it('reads a seal-in rung with branches in parentheses', () => {
    const doc = threeWireForward();
    expect(rungText(doc.rungs[0]!, doc)).toBe('S1 AND (S2 OR K1) AND NOT K2 -> K1');
  });

  it('writes each contact variant', () => {
    expect(one(no('a', 'S1'), nc('b', 'S2'), rising('c', 'S3'), falling('d', 'S4'), coil('k', 'K1'))).toBe(
      'S1 AND NOT S2 AND RISING S3 AND FALLING S4 -> K1',
    );
  });

  it('writes each coil variant and several outputs', () => {
    expect(one(no('a', 'S1'), coil('k1', 'K1'), coil('k2', 'P1', 'negated'), coil('k3', 'H1', 'set'), coil('k4', '%MX1', 'reset'))).toBe(
      'S1 -> K1, NOT P1, SET H1, RESET %MX1',
    );
  });

  it('uses tag names for addresses that have a tag, and declared spellings', () => {
    expect(one(no('a', '%IX2'), no('b', 's3'), no('c', '%IX8'), coil('k', '%qx1'))).toBe('S2 AND S3 AND %IX8 -> K1');
  });

  it('writes a block with its power-flow input and presets', () => {
    expect(one(no('a', 'S2'), block('b', 'TON', 'T1', { PT: 'T#3s' }), coil('k', 'H1'))).toBe('TON T1(IN := S2, PT := T#3s) -> H1');
    expect(one(block('b', 'CTU', 'C1', { PV: '3', R: '%IX1' }))).toBe('CTU C1(R := S1, PV := 3)');
  });

  it('writes a final parallel with its own conditions per branch', () => {
    expect(one(no('a', 'S2'), parallel('p', coil('k1', 'K1'), series('s', no('b', 'B1'), coil('k2', 'H1'))))).toBe('S2 -> K1, (B1 -> H1)');
  });

  it('keeps an OR group intact when the branch holds a block', () => {
    expect(one(parallel('p', series('s', no('a', 'S2'), block('b', 'TOF', 'T2', { PT: 'T#2s' })), no('c', 'S3')), coil('k', 'P1'))).toBe(
      '(TOF T2(IN := S2, PT := T#2s) OR S3) -> P1',
    );
  });

  it('shows missing operands as "?", an empty rung, and a coil straight on the rail', () => {
    expect(one(no('a', ''), coil('k', ''))).toBe('? -> ?');
    expect(one()).toBe('(empty rung)');
    expect(one(coil('k', 'K1'))).toBe('TRUE -> K1');
  });

  it('splits at a coil in the middle of a rung, as the coil passes power on', () => {
    expect(one(no('a', 'S1'), coil('k1', 'K1'), no('b', 'S2'), coil('k2', 'H1'))).toBe('S1 -> K1; S1 AND S2 -> H1');
  });
});

describe('programText', () => {
  it('numbers one line per rung', () => {
    const doc = program([rung('r1', no('a', 'S2'), coil('k', 'K1')), rung('r2', nc('b', 'K1'), coil('k2', 'P1'))], CONVEYOR_TAGS);
    expect(programText(doc)).toBe('1: S2 -> K1\n2: NOT K1 -> P1');
  });
});
