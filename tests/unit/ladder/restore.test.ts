import { describe, expect, it } from 'vitest';
import { createEmptyProgram, freshId, parseProgram, parseProgramText } from '@shared/ladder/restore';
import { ProgramSchema } from '@shared/ladder/schema';
import { threeWireForward } from './fixtures';

const base = { format: 'rungwright.program', version: 1 };
const contact = (id: string) => ({ kind: 'contact', id, variant: 'no', operand: 'S1' });
const withRungs = (...rungs: unknown[]) => ({ ...base, rungs });
const rungOf = (id: string, ...items: unknown[]) => ({ id, network: { kind: 'series', id: `${id}-n`, items } });

function error(json: unknown): string {
  const result = parseProgram(json);
  if (result.ok) throw new Error('expected the document to be refused');
  return result.error;
}

describe('parseProgram', () => {
  it('loads a saved program unchanged', () => {
    const doc = threeWireForward();
    const result = parseProgram(JSON.parse(JSON.stringify(doc)));
    expect(result).toEqual({ ok: true, value: doc });
  });

  it('fills in defaults for title, description, tags and rung comments', () => {
    const result = parseProgram(withRungs(rungOf('r1', contact('c1'))));
    expect(result.ok && result.value).toMatchObject({ title: 'Untitled program', description: '', tags: [], rungs: [{ comment: '' }] });
  });

  it('names the path of an unknown element kind', () => {
    expect(error(withRungs(rungOf('r1'), rungOf('r2'), rungOf('r3', { kind: 'lamp', id: 'x' })))).toBe(
      'rungs[2].network.items[0]: unknown element kind "lamp" (expected contact, coil, block, series or parallel)',
    );
  });

  it('explains a bad field inside a nested node of a known kind', () => {
    const doc = withRungs(rungOf('r1', { kind: 'parallel', id: 'p', branches: [{ ...contact('c1'), variant: 'maybe' }] }));
    expect(error(doc)).toBe('rungs[0].network.items[0].branches[0].variant: unknown variant "maybe" (expected no, nc, rising, falling)');
    expect(error(withRungs(rungOf('r1', { kind: 'coil', id: 'k', variant: 'coil' })))).toBe(
      'rungs[0].network.items[0].operand: missing (expected string)',
    );
    expect(error(withRungs(rungOf('r1', { kind: 'block', id: 'b', type: 'TIMER', instance: 'T1', inputs: {} })))).toContain(
      'unknown block type "TIMER"',
    );
    expect(error(withRungs(rungOf('r1', 42)))).toBe('rungs[0].network.items[0]: expected a network node (an object with a "kind"), got 42');
  });

  it('says what is wrong with a node whose kind is missing or not a name, or that is not an object', () => {
    const inBranch = (node: unknown) => withRungs(rungOf('r1', { kind: 'parallel', id: 'p', branches: [contact('c1'), node] }));
    expect(error(inBranch({ id: 'x' }))).toBe('rungs[0].network.items[0].branches[1]: a network node needs a "kind" (contact, coil, block, series or parallel)');
    expect(error(inBranch({ kind: 7, id: 'x' }))).toBe('rungs[0].network.items[0].branches[1]: a network node needs a "kind" (contact, coil, block, series or parallel)');
    expect(error(inBranch([contact('c2')]))).toBe('rungs[0].network.items[0].branches[1]: expected a network node (an object with a "kind"), got a list');
    expect(error(inBranch(null))).toBe('rungs[0].network.items[0].branches[1]: expected a network node (an object with a "kind"), got null');
  });

  it('says when the document is not a Rungwright program or another version', () => {
    expect(error([])).toBe('the document is not a Rungwright program: expected a JSON object, got a list');
    expect(error({ ...base, format: 'other', rungs: [] })).toBe('format: not a Rungwright program (expected "rungwright.program")');
    expect(error({ ...base, version: 2, rungs: [] })).toBe('version: this document is version 2; Rungwright reads version 1');
    expect(error(base)).toBe('rungs: missing (expected array)');
  });

  it('refuses repeated ids, naming both places', () => {
    expect(error(withRungs(rungOf('r1', contact('c1')), rungOf('r2', contact('c1'))))).toBe(
      'rungs[1].network.items[0]: duplicate id "c1" (first used at rungs[0].network.items[0])',
    );
  });

  it('lists several problems and says how many more there are', () => {
    const tags = Array.from({ length: 7 }, (_, i) => ({ name: `${i}bad`, address: '%IX1' }));
    const message = error({ ...withRungs(), tags });
    expect(message.split('; ')).toHaveLength(5);
    expect(message).toMatch(/\(and 2 more\)$/);
  });

  it('reads JSON text and says when it is not JSON', () => {
    expect(parseProgramText(JSON.stringify(threeWireForward())).ok).toBe(true);
    const bad = parseProgramText('{"format": ');
    expect(bad.ok).toBe(false);
    expect(!bad.ok && bad.error).toMatch(/^the file is not valid JSON: /);
  });
});

describe('createEmptyProgram and freshId', () => {
  it('creates a valid program with one empty rung', () => {
    const doc = createEmptyProgram('  Lab 1  ');
    expect(ProgramSchema.safeParse(doc).success).toBe(true);
    expect(doc.title).toBe('Lab 1');
    expect(createEmptyProgram().title).toBe('Untitled program');
    expect(doc.rungs).toHaveLength(1);
  });

  it('hands out the smallest unused id with the prefix', () => {
    const doc = threeWireForward();
    expect(freshId(doc, 'c')).toBe('c5');
    expect(freshId(doc, 'k')).toBe('k2');
    expect(freshId(doc, 'rung')).toBe('rung1');
  });
});
