import { describe, expect, it } from 'vitest';
import { formatTime, parseTimeLiteral } from '@shared/ladder/time';

function ms(text: string): number {
  const result = parseTimeLiteral(text);
  if (!result.ok) throw new Error(`expected ${text} to parse, got: ${result.error}`);
  return result.value;
}

function error(text: string): string {
  const result = parseTimeLiteral(text);
  if (result.ok) throw new Error(`expected ${text} to be refused, got ${result.value} ms`);
  return result.error;
}

describe('parseTimeLiteral', () => {
  it.each([
    ['T#500ms', 500],
    ['T#2s', 2000],
    ['T#1m30s', 90_000],
    ['TIME#1.5s', 1500],
    ['t#2S', 2000],
    ['time#250MS', 250],
    ['T#1h', 3_600_000],
    ['T#1d2h', 93_600_000],
    ['T#1_000ms', 1000],
    ['T#1h_30m', 5_400_000],
    ['T#90m', 5_400_000],
    ['T#0ms', 0],
    ['T#0.25s', 250],
    ['T#1.5m', 90_000],
    ['T#+3s', 3000],
    ['  T#2s  ', 2000],
    ['T#1d2h3m4s5ms', 93_784_005],
  ])('reads %s as %i ms', (text, expected) => {
    expect(ms(text)).toBe(expected);
  });

  it('reads a negative literal as a negative number of ms', () => {
    expect(ms('T#-2s')).toBe(-2000);
    expect(ms('T#-1m30s')).toBe(-90_000);
    expect(ms('T#-0s')).toBe(0);
  });

  it('says which unit it does not know', () => {
    expect(error('T#5x')).toBe('T#5x: unknown unit "x" (use d, h, m, s or ms)');
    expect(error('T#2min')).toContain('unknown unit "min"');
  });

  it('says when nothing follows the prefix', () => {
    expect(error('T#')).toBe('T#: no duration after "T#"');
    expect(error('TIME#')).toBe('TIME#: no duration after "TIME#"');
    expect(error('T#-')).toBe('T#-: no duration after the sign');
  });

  it('refuses units out of order and repeated units', () => {
    expect(error('T#1s5h')).toBe('T#1s5h: units out of order (largest first: d, h, m, s, ms)');
    expect(error('T#1s2s')).toBe('T#1s2s: unit "s" appears twice');
  });

  it('refuses a number without a unit and a unit without a number', () => {
    expect(error('T#5')).toBe('T#5: the number 5 needs a unit (d, h, m, s or ms)');
    expect(error('T#s')).toBe('T#s: a number is missing before "s"');
  });

  it('allows a fraction only on the last part', () => {
    expect(error('T#1.5m30s')).toBe('T#1.5m30s: only the last part of a duration may have a fraction');
  });

  it('lets only the first part overflow', () => {
    expect(error('T#1h75m')).toBe('T#1h75m: 75m is more than one hour; only the first part of a duration may overflow');
    expect(error('T#1s1000ms')).toContain('more than one second');
  });

  it('refuses fractions of a millisecond and sub-millisecond units', () => {
    expect(error('T#1.5ms')).toBe('T#1.5ms: Rungwright counts time in whole milliseconds');
    expect(error('T#10us')).toContain('finer than');
  });

  it('refuses stray characters, misplaced underscores and text that is not a duration', () => {
    expect(error('T#2s!')).toBe('T#2s!: unexpected "!" in the duration');
    expect(error('T#1__0s')).toContain('underscore');
    expect(error('T#2s_')).toContain('cannot end with "_"');
    expect(error('2s')).toBe('2s: a duration starts with "T#" or "TIME#", e.g. T#2s');
    expect(error('')).toContain('(empty)');
  });

  it('refuses absurdly long durations instead of losing precision', () => {
    expect(error('T#99999999999d')).toContain('too long');
  });
});

describe('formatTime', () => {
  it.each([
    [1500, 'T#1s500ms'],
    [90_000, 'T#1m30s'],
    [0, 'T#0ms'],
    [5, 'T#5ms'],
    [3_600_000, 'T#1h'],
    [93_784_005, 'T#1d2h3m4s5ms'],
    [-2000, 'T#-2s'],
    [1499.6, 'T#1s500ms'],
  ])('prints %d ms as %s', (value, expected) => {
    expect(formatTime(value)).toBe(expected);
  });

  it('prints a literal that parses back to the same number of ms', () => {
    for (const value of [0, 1, 999, 1000, 59_999, 60_000, 86_399_999, 86_400_000, 123_456_789, -4321]) {
      expect(ms(formatTime(value))).toBe(value);
    }
  });
});
