/**
 * Literal forms of IEC 61131-3:2013 that Rungwright reads, checked against the standard's own
 * examples (recalled: the standard is sold, no public copy was at hand; clause and table numbers
 * are [memory], as in docs/published-values.md) and, for the arithmetic of durations, against mathjs's unit
 * conversion as an independent reference.
 */
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { parseAddress, formatAddress, addressInRange, DEFAULT_ADDRESS_SPACE } from '@shared/ladder/addresses';
import { resolveOperand, buildSymbolTable } from '@shared/ladder/operands';
import { parseTimeLiteral } from '@shared/ladder/time';
import { createEmptyProgram } from '@shared/ladder/restore';

const MATHJS_UNIT = { d: 'day', h: 'hour', m: 'minute', s: 's', ms: 'ms' } as const;

/** The duration in ms by mathjs: sum the `<number><unit>` parts (underscores removed, sign applied). */
function mathjsMs(literal: string): number {
  const body = literal.replace(/^(?:T|TIME)#/i, '').replaceAll('_', '');
  const sign = body.startsWith('-') ? -1 : 1;
  const parts = [...body.replace(/^[+-]/, '').matchAll(/(\d+(?:\.\d+)?)(ms|d|h|m|s)/gi)];
  const total = parts.reduce((sum, [, value, u]) => {
    const key = u!.toLowerCase() as keyof typeof MATHJS_UNIT;
    return sum + unit(Number(value), MATHJS_UNIT[key]).toNumber('ms');
  }, 0);
  return sign * Math.round(total);
}

function ms(literal: string): number {
  const result = parseTimeLiteral(literal);
  if (!result.ok) throw new Error(result.error);
  return result.value;
}

describe('IEC 61131-3 duration literals (clause 6.3.3, Table 8 [memory])', () => {
  // Examples in the form the standard's table gives them [memory]: short and long prefix, any case,
  // a fraction on the last unit, overflow of the first unit, underscores between parts.
  it.each([
    'T#14ms',
    'T#-14ms',
    'TIME#14ms',
    'TIME#-14ms',
    'time#14.7s',
    'T#14.7s',
    'T#14.7m',
    'T#14.7h',
    't#14.7d',
    't#25h15m',
    't#25h_15m',
    'T#5d14h12m18s3ms',
    't#5d_14h_12m_18s_3ms',
  ])('reads %s to the same number of ms as mathjs unit conversion', (literal) => {
    expect(ms(literal)).toBe(mathjsMs(literal));
  });

  it('gives the worked values in ms', () => {
    expect(ms('T#14.7s')).toBe(14_700);
    expect(ms('t#25h15m')).toBe(90_900_000);
    expect(ms('T#14.7h')).toBe(52_920_000);
  });

  it('refuses a fraction of a millisecond, which the standard allows but Rungwright cannot count', () => {
    // 't#5d_14h_12m_18s_3.5ms' is a legal IEC literal [memory]; Rungwright's time base is 1 ms.
    expect(parseTimeLiteral('t#5d_14h_12m_18s_3.5ms')).toEqual({ ok: false, error: 't#5d_14h_12m_18s_3.5ms: Rungwright counts time in whole milliseconds' });
  });

  it('refuses LTIME literals with a message, as LTIME is not offered', () => {
    const result = parseTimeLiteral('LT#14.7s');
    expect(result.ok).toBe(false);
    expect(!result.ok && result.error).toContain('starts with "T#" or "TIME#"');
  });
});

describe('IEC 61131-3 direct variables (clause 6.5.5 [memory])', () => {
  it('reads a bit with and without the X size prefix as the same bit (%QX75 and %Q75 [memory])', () => {
    expect(parseAddress('%QX75')).toEqual({ ok: true, value: { area: 'Q', index: 75 } });
    expect(parseAddress('%Q75')).toEqual(parseAddress('%QX75'));
    expect(formatAddress({ area: 'Q', index: 75 })).toBe('%QX75');
  });

  it('knows the three location prefixes I, Q, M', () => {
    expect(['%IX1', '%QX1', '%MX1'].map((a) => parseAddress(a).ok)).toEqual([true, true, true]);
    expect(parseAddress('%AX1').ok).toBe(false);
  });

  it.each(['%IW215', '%QB7', '%MD48', '%IL1'])('refuses the non-bit size prefix in %s', (text) => {
    expect(parseAddress(text)).toEqual({ ok: false, error: `"${text}": only bit addresses (%IX, %QX, %MX) are supported` });
  });

  it('refuses hierarchical addresses (%IX1.2) and partly specified ones (%I*)', () => {
    expect(parseAddress('%IX1.2').ok).toBe(false);
    expect(parseAddress('%I*').ok).toBe(false);
  });

  it('parses a valid bit beyond the panel, then says it is out of range', () => {
    const result = parseAddress('%QX75');
    expect(result.ok && addressInRange(result.value, DEFAULT_ADDRESS_SPACE)).toBe('%QX75 is out of range: this panel has outputs %QX1..%QX6');
  });
});

describe('IEC 61131-3 integer and boolean literals (clause 6.3.2, Table 5 [memory])', () => {
  const symbols = buildSymbolTable(createEmptyProgram());
  const value = (text: string) => {
    const result = resolveOperand(text, symbols);
    if (!result.ok) throw new Error(result.error);
    return result.value;
  };

  it.each([
    ['-12', -12],
    ['0', 0],
    ['+986', 986],
    ['12_345', 12_345],
    ['2#1111_1111', 255],
    ['8#377', 255],
    ['16#FF', 255],
    ['16#E0', 224],
  ])('reads %s as the INT %i', (text, expected) => {
    expect(value(text)).toEqual({ kind: 'int', value: expected });
  });

  it('refuses 123_456, which is a legal literal but outside INT (-32768..32767, Table 10 [memory])', () => {
    expect(resolveOperand('123_456', symbols)).toEqual({ ok: false, error: '123_456: an INT lies between -32768 and 32767' });
  });

  it('reads TRUE and FALSE in any case', () => {
    expect(value('TRUE')).toEqual({ kind: 'bool', value: true });
    expect(value('false')).toEqual({ kind: 'bool', value: false });
  });
});
