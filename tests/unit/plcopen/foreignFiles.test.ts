import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { canonical, comparable } from './programs';

function fixture(name: string): string {
  return readFileSync(fileURLToPath(new URL(`../../fixtures/plcopen/${name}`, import.meta.url)), 'utf8');
}

function imported(name: string): { program: Program; warnings: string[] } {
  const result = importPlcopen(fixture(name));
  if (!result.ok) throw new Error(`import of ${name} failed: ${result.error}`);
  return result.value;
}

/** `no:Stop` for a contact, `coil:Motor`, `TON:T1` — the network read as a list of what it holds. */
function labels(node: NetworkNode): unknown {
  if (node.kind === 'series') return node.items.map(labels);
  if (node.kind === 'parallel') return { or: node.branches.map(labels) };
  if (node.kind === 'block') return `${node.type}:${node.instance}`;
  return `${node.variant}:${node.operand}`;
}

describe('importing a file written in another style (one rail pair, scrambled positions, shuffled connections)', () => {
  const { program, warnings } = imported('foreign-three-wire.xml');

  it('finds the two rungs from the connections, in the order of their vertical position', () => {
    expect(program.rungs).toHaveLength(2);
    expect(program.rungs.map((r) => r.comment)).toEqual(['Three-wire control, sealed in by Motor', 'Start-up warning: 5 s']);
  });

  it('recovers the seal-in rung: stop, start OR holding contact, NC overload, two coils in parallel', () => {
    const rung = program.rungs[0]!;
    expect(canonical(rung.network)).toBe(
      'S(contact:no:Stop P(contact:no:Motor | contact:no:Start) contact:nc:Overload P(coil:coil:Lamp | coil:coil:Motor))',
    );
  });

  it('orders parallel branches top to bottom by position, though the file lists them the other way', () => {
    // Overload's connections list Motor (y 110) before Start (y 50); the right rail lists Lamp first.
    expect(labels(program.rungs[0]!.network)).toEqual([
      'no:Stop',
      { or: ['no:Start', 'no:Motor'] },
      'nc:Overload',
      { or: ['coil:Lamp', 'coil:Motor'] },
    ]);
  });

  it('takes the timer preset from the inVariable and the coil feed from the block output Q', () => {
    const rung = program.rungs[1]!;
    expect(rung.network.items).toMatchObject([
      { kind: 'contact', variant: 'no', operand: 'Motor' },
      { kind: 'block', type: 'TON', instance: 'T1', inputs: { PT: 'T#5s' } },
      { kind: 'coil', variant: 'coil', operand: 'Delayed' },
    ]);
  });

  it('makes tags of the variables with an address, keeps their documentation as the tag comment', () => {
    expect(program.tags.slice(0, 5)).toEqual([
      { name: 'Stop', address: '%IX1', comment: 'S1 stop button, wired NC' },
      { name: 'Start', address: '%IX2', comment: '' },
      { name: 'Motor', address: '%QX1', comment: 'K1 forward contactor' },
      { name: 'Overload', address: '%IX6', comment: '' },
      { name: 'Lamp', address: '%QX4', comment: '' },
    ]);
  });

  it('gives the name without an address a free memory bit and says so', () => {
    expect(program.tags[5]).toEqual({ name: 'Delayed', address: '%MX1', comment: 'on 5 s after the motor starts' });
    expect(warnings).toContain('variable "Delayed" has no address: it becomes the tag Delayed on memory bit %MX1');
  });

  it('matches names without regard to case and writes them as declared', () => {
    // The second rung's contact says "motor"; IEC identifiers are case-insensitive.
    expect(program.rungs[1]!.network.items[0]).toMatchObject({ operand: 'Motor' });
  });

  it('reads the title and description from the content header', () => {
    expect(program.title).toBe('Conveyor start-up (fixture)');
    expect(program.description).toBe('Three-wire control with a start-up delay.');
  });

  it('gives every rung and node an id unique in the program', () => {
    const ids: string[] = [];
    const walk = (node: NetworkNode): void => {
      ids.push(node.id);
      if (node.kind === 'series') node.items.forEach(walk);
      if (node.kind === 'parallel') node.branches.forEach(walk);
    };
    for (const rung of program.rungs) {
      ids.push(rung.id);
      walk(rung.network);
    }
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('survives its own export and import unchanged', () => {
    const again = importPlcopen(exportPlcopen(program));
    expect(again.ok && comparable(again.value.program)).toEqual(comparable(program));
  });
});

describe('importing chained coils, rails per rung and paths that share only the rails', () => {
  const { program, warnings } = imported('foreign-coils-in-series.xml');

  it('makes each group of connected elements its own rung, ordered by vertical position', () => {
    expect(program.rungs.map((r) => labels(r.network))).toEqual([
      ['rising:%IX2', 'set:%MX5'],
      ['no:%IX1', 'reset:%MX5'],
      ['no:%IX4', 'coil:%QX2', 'coil:%QX3'],
    ]);
  });

  it('ends a rung at a coil whose output is wired nowhere', () => {
    expect(program.rungs[2]!.network.items.at(-1)).toMatchObject({ kind: 'coil', operand: '%QX3' });
  });

  it('reads the program POU and warns that the function block POU was left out', () => {
    expect(warnings).toContain('pou "HelperBlock" (pouType functionBlock) was left out: Rungwright reads one program');
    expect(program.tags).toEqual([]);
  });
});

describe('refusing hand-written files Rungwright cannot hold', () => {
  it('refuses a network that is not series-parallel, naming where it starts', () => {
    const result = importPlcopen(fixture('foreign-bridge.xml'));
    expect(result.ok).toBe(false);
    expect(!result.ok && result.error).toMatch(/^the rung that starts at contact \(localId 2\) is not series-parallel/);
  });

  it('refuses a jump, naming it and its localId', () => {
    const result = importPlcopen(fixture('foreign-jump.xml'));
    expect(!result.ok && result.error).toBe('jump (localId 12) is not supported: Rungwright rungs have no jumps; every rung runs on every scan');
  });

  it('refuses a program written in Structured Text', () => {
    const result = importPlcopen(fixture('foreign-st-body.xml'));
    expect(!result.ok && result.error).toBe('pou "TextProgram" (pouType program) has an ST body; Rungwright reads only LD (ladder diagram) bodies');
  });
});
