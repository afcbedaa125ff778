import { describe, expect, it } from 'vitest';
import {
  addRung,
  addTag,
  deleteRung,
  deleteTag,
  duplicateRung,
  moveRung,
  renameTag,
  setDescription,
  setRungComment,
  setTitle,
  updateTag,
} from '@shared/ladder/edits';
import { allIds } from '@shared/ladder/walk';
import { programText } from '@shared/ladder/text';
import type { Program } from '@shared/ladder/schema';
import { block, coil, no, program, rung, tag, threeWireForward } from './fixtures';

const two = (): Program =>
  program([rung('r1', no('c1', 'Start'), coil('k1', 'Motor')), rung('r2', no('c2', 'start'), block('b1', 'TON', 'T1', { PT: 'T#1s' }))], [
    tag('Start', '%IX2'),
    tag('Motor', '%QX1'),
  ]);

describe('addRung, deleteRung', () => {
  it('adds an empty rung with fresh ids at the end, at the top, or after a rung', () => {
    const doc = two();
    expect(addRung(doc).rungs.map((r) => r.id)).toEqual(['r1', 'r2', 'rung1']);
    expect(addRung(doc).rungs[2]!.network).toEqual({ kind: 'series', id: 'ser1', items: [] });
    expect(addRung(doc, { afterRungId: null }).rungs.map((r) => r.id)).toEqual(['rung1', 'r1', 'r2']);
    expect(addRung(doc, { afterRungId: 'r1' }).rungs.map((r) => r.id)).toEqual(['r1', 'rung1', 'r2']);
  });

  it('adds a given rung, renaming only the ids already taken', () => {
    const next = addRung(two(), { rung: rung('r1', no('c1', 'Start'), no('c9', 'Motor'), coil('k9', 'Motor')) });
    expect(next.rungs[2]!.id).toBe('rung1');
    expect(next.rungs[2]!.network.items.map((n) => n.id)).toEqual(['con1', 'c9', 'k9']);
    expect(new Set(allIds(next)).size).toBe(allIds(next).length);
  });

  it('returns the same document for an unknown anchor or an invalid rung', () => {
    const doc = two();
    expect(addRung(doc, { afterRungId: 'nope' })).toBe(doc);
    expect(addRung(doc, { rung: { id: 'x', network: { kind: 'series', id: 'y', items: [{ kind: 'lamp' }] } } })).toBe(doc);
  });

  it('deleting an added rung gives back the document', () => {
    const doc = two();
    expect(deleteRung(addRung(doc), { rungId: 'rung1' })).toEqual(doc);
    expect(deleteRung(doc, { rungId: 'nope' })).toBe(doc);
  });
});

describe('moveRung, duplicateRung, setRungComment', () => {
  it('moves a rung and moves it back', () => {
    const doc = two();
    const moved = moveRung(doc, { rungId: 'r1', offset: 1 });
    expect(moved.rungs.map((r) => r.id)).toEqual(['r2', 'r1']);
    expect(moveRung(moved, { rungId: 'r1', offset: -1 })).toEqual(doc);
    expect(moveRung(doc, { rungId: 'r1', offset: -1 })).toBe(doc);
  });

  it('duplicates a rung below itself with fresh ids for every node', () => {
    const next = duplicateRung(two(), { rungId: 'r2' });
    expect(next.rungs.map((r) => r.id)).toEqual(['r1', 'r2', 'rung1']);
    expect(next.rungs[2]!.network.items.map((n) => n.id)).toEqual(['con1', 'blk1']);
    expect(next.rungs[2]!.network.id).toBe('ser1');
    expect(programText(next).split('\n')[2]).toBe('3: TON T1(IN := Start, PT := T#1s)');
  });

  it('sets a rung comment and returns the same document for the same comment', () => {
    const doc = two();
    const commented = setRungComment(doc, { rungId: 'r1', comment: ' three-wire start ' });
    expect(commented.rungs[0]!.comment).toBe('three-wire start');
    expect(setRungComment(commented, { rungId: 'r1', comment: 'three-wire start' })).toBe(commented);
    expect(setRungComment(commented, { rungId: 'r1', comment: '' })).toEqual(doc);
  });
});

describe('tags', () => {
  it('adds a tag, and refuses a taken name in any case or an invalid tag', () => {
    const doc = two();
    const added = addTag(doc, { tag: { name: 'Lamp', address: ' %QX4 ' } });
    expect(added.tags.at(-1)).toEqual({ name: 'Lamp', address: '%QX4', comment: '' });
    expect(addTag(doc, { tag: { name: 'START', address: '%IX3' } })).toBe(doc);
    expect(addTag(doc, { tag: { name: '9lives', address: '%IX3' } })).toBe(doc);
    expect(addTag(doc, { tag: { name: 'First', address: '%IX3' }, index: 0 }).tags[0]!.name).toBe('First');
  });

  it('deleting a tag that no operand uses undoes adding it', () => {
    const doc = two();
    expect(deleteTag(addTag(doc, { tag: { name: 'Lamp', address: '%QX4' } }), { name: 'Lamp' })).toEqual(doc);
  });

  it('updates a tag address or comment', () => {
    const doc = two();
    const next = updateTag(doc, { name: 'start', address: '%IX3', comment: 'forward' });
    expect(next.tags[0]).toEqual({ name: 'Start', address: '%IX3', comment: 'forward' });
    expect(updateTag(doc, { name: 'Start', address: '%IX2' })).toBe(doc);
    expect(updateTag(doc, { name: 'Nope', address: '%IX2' })).toBe(doc);
  });

  it('renames a tag and every operand using it, in any case; renaming back restores the document', () => {
    const doc = two();
    const renamed = renameTag(doc, { from: 'Start', to: 'Forward' });
    expect(renamed.tags[0]!.name).toBe('Forward');
    expect(programText(renamed)).toBe('1: Forward -> Motor\n2: TON T1(IN := Forward, PT := T#1s)');
    const back = renameTag(renamed, { from: 'Forward', to: 'Start' });
    expect(back.tags).toEqual(doc.tags);
    expect(programText(back)).toBe(programText(doc));
  });

  it('refuses a rename onto another tag or to a bad name', () => {
    const doc = two();
    expect(renameTag(doc, { from: 'Start', to: 'motor' })).toBe(doc);
    expect(renameTag(doc, { from: 'Start', to: 'a b' })).toBe(doc);
    expect(renameTag(doc, { from: 'Start', to: 'Start' })).toBe(doc);
    expect(renameTag(doc, { from: 'Start', to: 'START' }).tags[0]!.name).toBe('START');
  });

  it('deleting a tag puts its address into the operands that used it', () => {
    const next = deleteTag(two(), { name: 'Start' });
    expect(next.tags.map((t) => t.name)).toEqual(['Motor']);
    expect(programText(next)).toBe('1: %IX2 -> Motor\n2: TON T1(IN := %IX2, PT := T#1s)');
  });
});

describe('setTitle and setDescription', () => {
  it('sets them and returns the same document when unchanged', () => {
    const doc = threeWireForward();
    const titled = setTitle(doc, { title: '  Conveyor forward  ' });
    expect(titled.title).toBe('Conveyor forward');
    expect(setTitle(titled, { title: 'Conveyor forward' })).toBe(titled);
    expect(setTitle(doc, { title: '' }).title).toBe('Untitled program');
    const described = setDescription(doc, { description: 'Demo lab.\n' });
    expect(described.description).toBe('Demo lab.');
    expect(setDescription(described, { description: 'Demo lab.' })).toBe(described);
    expect(setTitle(doc, { title: 'x'.repeat(201) })).toBe(doc);
  });
});
