import { describe, expect, it } from 'vitest';
import { setBlockInput, setBlockInstance, setBlockType, setComment, setOperand, setVariant } from '@shared/ladder/edits';
import { rungText } from '@shared/ladder/text';
import type { Block, Program } from '@shared/ladder/schema';
import { block, coil, no, program, rung, CONVEYOR_TAGS } from './fixtures';

const doc = (): Program =>
  program([rung('r1', no('c1', 'S1'), block('b1', 'TON', 'T1', { PT: 'T#3s' }), coil('k1', 'K1'))], CONVEYOR_TAGS);
const text = (d: Program) => rungText(d.rungs[0]!, d);
const theBlock = (d: Program) => d.rungs[0]!.network.items[1] as Block;

describe('setOperand', () => {
  it('sets a contact or coil operand, trimmed', () => {
    expect(text(setOperand(doc(), { elementId: 'c1', operand: ' S2 ' }))).toBe('TON T1(IN := S2, PT := T#3s) -> K1');
    expect(text(setOperand(doc(), { elementId: 'k1', operand: 'P1' }))).toBe('TON T1(IN := S1, PT := T#3s) -> P1');
  });

  it('is undone by setting the old operand back', () => {
    const original = doc();
    const changed = setOperand(original, { elementId: 'c1', operand: 'S2' });
    expect(setOperand(changed, { elementId: 'c1', operand: 'S1' })).toEqual(original);
  });

  it('returns the same document for the same operand, an unknown id, a block, or text too long', () => {
    const original = doc();
    expect(setOperand(original, { elementId: 'c1', operand: 'S1' })).toBe(original);
    expect(setOperand(original, { elementId: 'zz', operand: 'S2' })).toBe(original);
    expect(setOperand(original, { elementId: 'b1', operand: 'S2' })).toBe(original);
    expect(setOperand(original, { elementId: 'c1', operand: 'x'.repeat(65) })).toBe(original);
  });
});

describe('setVariant', () => {
  it('changes contact and coil variants', () => {
    let d = setVariant(doc(), { elementId: 'c1', variant: 'nc' });
    d = setVariant(d, { elementId: 'k1', variant: 'set' });
    expect(text(d)).toBe('TON T1(IN := NOT S1, PT := T#3s) -> SET K1');
  });

  it('refuses a coil variant on a contact and the other way round', () => {
    const original = doc();
    expect(setVariant(original, { elementId: 'c1', variant: 'set' })).toBe(original);
    expect(setVariant(original, { elementId: 'k1', variant: 'rising' })).toBe(original);
    expect(setVariant(original, { elementId: 'c1', variant: 'no' })).toBe(original);
  });
});

describe('setBlockType', () => {
  it('keeps inputs the new type shares and drops the others', () => {
    const tof = setBlockType(doc(), { elementId: 'b1', type: 'TOF' });
    expect(theBlock(tof)).toMatchObject({ type: 'TOF', inputs: { PT: 'T#3s' } });
    expect(theBlock(setBlockType(doc(), { elementId: 'b1', type: 'CTU' })).inputs).toEqual({});
  });

  it('returns the same document for the same type or an unknown type', () => {
    const original = doc();
    expect(setBlockType(original, { elementId: 'b1', type: 'TON' })).toBe(original);
    expect(setBlockType(original, { elementId: 'b1', type: 'TIMER' as 'TON' })).toBe(original);
  });
});

describe('setBlockInput', () => {
  it('sets and clears an operand input', () => {
    const set = setBlockInput(doc(), { elementId: 'b1', input: 'PT', operand: 'T#5s' });
    expect(theBlock(set).inputs).toEqual({ PT: 'T#5s' });
    expect(theBlock(setBlockInput(set, { elementId: 'b1', input: 'PT', operand: '' })).inputs).toEqual({});
  });

  it('refuses the power-flow input and inputs the type lacks', () => {
    const original = doc();
    expect(setBlockInput(original, { elementId: 'b1', input: 'IN', operand: 'S2' })).toBe(original);
    expect(setBlockInput(original, { elementId: 'b1', input: 'PV', operand: '3' })).toBe(original);
    expect(setBlockInput(original, { elementId: 'b1', input: 'PT', operand: 'T#3s' })).toBe(original);
  });
});

describe('setBlockInstance and setComment', () => {
  it('renames an instance, trimmed', () => {
    expect(theBlock(setBlockInstance(doc(), { elementId: 'b1', instance: ' T9 ' })).instance).toBe('T9');
    const original = doc();
    expect(setBlockInstance(original, { elementId: 'b1', instance: 'T1' })).toBe(original);
    expect(setBlockInstance(original, { elementId: 'c1', instance: 'T2' })).toBe(original);
    expect(setBlockInstance(original, { elementId: 'b1', instance: 'x'.repeat(33) })).toBe(original);
  });

  it('sets and removes an element comment, and removing restores the document', () => {
    const original = doc();
    const commented = setComment(original, { elementId: 'c1', comment: 'stop button, NC' });
    expect(commented.rungs[0]!.network.items[0]).toMatchObject({ comment: 'stop button, NC' });
    expect(setComment(commented, { elementId: 'c1', comment: '' })).toEqual(original);
    expect(setComment(original, { elementId: 'c1', comment: '' })).toBe(original);
  });
});
