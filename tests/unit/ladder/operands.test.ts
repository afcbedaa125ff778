import { describe, expect, it } from 'vitest';
import { buildSymbolTable, resolveOperand, symbolKey } from '@shared/ladder/operands';
import { block, coil, no, program, rung, tag } from './fixtures';

const demo = program(
  [
    rung('r1', no('c1', 'Start'), block('b1', 'TON', 'T1', { PT: 'T#3s' }), coil('k1', '%QX3')),
    rung('r2', no('c2', 'T1.Q'), block('b2', 'CTU', 'C1', { PV: '3' }), coil('k2', 'Lamp')),
    rung('r3', no('c3', 'S2'), block('b3', 'TOF', 't1', { PT: 'T#1s' })),
  ],
  [tag('Start', '%IX2'), tag('Lamp', '%QX4'), tag('Broken', '%IW1'), tag('start', '%IX3')],
);
const symbols = buildSymbolTable(demo);

function value(text: string) {
  const result = resolveOperand(text, symbols);
  if (!result.ok) throw new Error(result.error);
  return result.value;
}

function refused(text: string): string {
  const result = resolveOperand(text, symbols);
  if (result.ok) throw new Error(`expected "${text}" to be refused, got ${JSON.stringify(result.value)}`);
  return result.error;
}

describe('buildSymbolTable', () => {
  it('keys tags and instances by their upper-case name, first declaration winning', () => {
    expect(symbols.tags.get('START')).toEqual({ area: 'I', index: 2 });
    expect(symbols.tags.get('LAMP')).toEqual({ area: 'Q', index: 4 });
    expect(symbols.instances.get('T1')).toBe('TON');
    expect(symbols.instances.get('C1')).toBe('CTU');
    expect(symbols.spellings.get(symbolKey('start'))).toBe('Start');
  });

  it('keeps tags with an unusable address apart, with the reason', () => {
    expect(symbols.tags.has('BROKEN')).toBe(false);
    expect(symbols.invalidTags.get('BROKEN')).toContain('only bit addresses');
  });
});

describe('resolveOperand', () => {
  it('reads direct addresses without a tag', () => {
    expect(value('%IX1')).toEqual({ kind: 'bit', address: { area: 'I', index: 1 } });
    expect(value('%mx12')).toEqual({ kind: 'bit', address: { area: 'M', index: 12 } });
  });

  it('resolves a tag in any case to its address and declared name', () => {
    expect(value('Start')).toEqual({ kind: 'bit', address: { area: 'I', index: 2 }, tag: 'Start' });
    expect(value('START')).toEqual({ kind: 'bit', address: { area: 'I', index: 2 }, tag: 'Start' });
  });

  it('resolves block outputs of existing instances', () => {
    expect(value('T1.Q')).toEqual({ kind: 'member', instance: 'T1', member: 'Q' });
    expect(value('t1.et')).toEqual({ kind: 'member', instance: 'T1', member: 'ET' });
    expect(value('C1.CV')).toEqual({ kind: 'member', instance: 'C1', member: 'CV' });
  });

  it('reads constants: durations, integers and booleans', () => {
    expect(value('T#2s')).toEqual({ kind: 'time', ms: 2000 });
    expect(value('T#-2s')).toEqual({ kind: 'time', ms: -2000 });
    expect(value('3')).toEqual({ kind: 'int', value: 3 });
    expect(value('-4')).toEqual({ kind: 'int', value: -4 });
    expect(value('1_000')).toEqual({ kind: 'int', value: 1000 });
    expect(value('16#1F')).toEqual({ kind: 'int', value: 31 });
    expect(value('2#1010')).toEqual({ kind: 'int', value: 10 });
    expect(value('TRUE')).toEqual({ kind: 'bool', value: true });
    expect(value('false')).toEqual({ kind: 'bool', value: false });
  });

  it('explains an unknown tag and suggests a close one', () => {
    expect(refused('Strt')).toBe(
      'unknown tag "Strt" (did you mean "Start"?) — add it to the tag table or use an address such as %IX2',
    );
    expect(refused('Conveyor')).toBe('unknown tag "Conveyor" — add it to the tag table or use an address such as %IX2');
  });

  it('explains a member the block does not have', () => {
    expect(refused('T1.QQ')).toBe('"T1" has no member "QQ"; a TON has Q and ET');
    expect(refused('C1.X')).toBe('"C1" has no member "X"; a CTU has Q and CV');
    expect(refused('T1.PT')).toBe('"T1.PT" is an input of the TON; only its outputs Q and ET can be read');
  });

  it('explains a member of something that is not a block', () => {
    expect(refused('T9.Q')).toBe('"T9" is not a block in this program: add a block named T9 to use T9.Q');
    expect(refused('Lamp.Q')).toBe('"Lamp" is a tag, not a block, so it has no member "Q"');
    expect(refused('T1.Q.X')).toContain('write it like T1.Q');
  });

  it('asks for a member when given a bare instance name', () => {
    expect(refused('T1')).toBe('"T1" is a TON block; name one of its outputs, e.g. T1.Q');
  });

  it('passes on the parsers\' messages for bad addresses, durations and integers', () => {
    expect(refused('%IW1')).toContain('only bit addresses');
    expect(refused('T#5x')).toContain('unknown unit "x"');
    expect(refused('99999')).toBe('99999: an INT lies between -32768 and 32767');
    expect(refused('16#G')).toContain('not a base-16 number');
    expect(refused('1.5')).toContain('decimal numbers are not used here');
  });

  it('says when a tag has no usable address', () => {
    expect(refused('Broken')).toMatch(/^tag "Broken" has no usable address: /);
  });

  it('refuses empty text and text that is no operand at all', () => {
    expect(refused('   ')).toContain('no operand given');
    expect(refused('S 1')).toContain('is not a valid operand');
  });
});
