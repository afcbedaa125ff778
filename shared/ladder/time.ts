/**
 * IEC 61131-3 duration literals (clause 6.3.3, Table 8 in the 2013 edition [memory]).
 *
 * Form: `T#` or `TIME#` (any case), an optional sign, then one or more `<number><unit>` parts with
 * units in descending order d, h, m, s, ms. Underscores may separate digits and parts
 * (`T#1_000ms`, `T#1h_30m`). Only the last part may carry a fraction (`T#1.5s`), and only the first
 * part may "overflow" its next-larger unit (`T#90m` is fine, `T#1h75m` is not) [memory]. Rungwright
 * counts time in whole milliseconds, so `us`/`ns` parts and results with a fraction of a
 * millisecond are refused with a message.
 */
import { fail, ok, type Result } from './result';

/** Units Rungwright accepts, largest first, with their size in ms. */
const UNITS = [
  { unit: 'd', ms: 86_400_000, limit: Infinity },
  { unit: 'h', ms: 3_600_000, limit: 24 },
  { unit: 'm', ms: 60_000, limit: 60 },
  { unit: 's', ms: 1_000, limit: 60 },
  { unit: 'ms', ms: 1, limit: 1000 },
] as const;

type Unit = (typeof UNITS)[number]['unit'];

const UNIT_NAMES = {
  d: 'days',
  h: 'hours',
  m: 'minutes',
  s: 'seconds',
  ms: 'milliseconds',
} as const satisfies Record<Unit, string>;

/** Longer durations are refused: no lab needs more than a year, and sums stay exact integers. */
const MAX_MS = 366 * 86_400_000;

const PREFIX = /^(?:T|TIME)#/i;

/** True when the text starts like a duration literal (`T#`, `TIME#`, any case). */
export function looksLikeTimeLiteral(text: string): boolean {
  return PREFIX.test(text.trim());
}

/**
 * Parse a duration literal into milliseconds. A negative literal (`T#-2s`) parses to a negative
 * number; whether a negative duration is acceptable is for validation to say.
 */
export function parseTimeLiteral(text: string): Result<number> {
  const source = text.trim();
  const prefix = PREFIX.exec(source);
  if (!prefix) return fail(`${source || '(empty)'}: a duration starts with "T#" or "TIME#", e.g. T#2s`);
  let rest = source.slice(prefix[0].length);
  const shown = prefix[0];
  if (rest === '') return fail(`${source}: no duration after "${shown}"`);

  let sign = 1;
  if (rest[0] === '-' || rest[0] === '+') {
    sign = rest[0] === '-' ? -1 : 1;
    rest = rest.slice(1);
    if (rest === '') return fail(`${source}: no duration after the sign`);
  }

  const partPattern = /^(\d[\d_]*)(?:\.(\d[\d_]*))?([A-Za-z]*)_?/;
  let total = 0;
  let previousIndex = -1;
  let partCount = 0;
  let sawFraction = false;
  while (rest !== '') {
    if (sawFraction) return fail(`${source}: only the last part of a duration may have a fraction`);
    const match = partPattern.exec(rest);
    if (!match) {
      const found = /^[A-Za-z]+/.exec(rest);
      if (found) return fail(`${source}: a number is missing before "${found[0]}"`);
      return fail(`${source}: unexpected "${rest[0]}" in the duration`);
    }
    const [whole, integerText, fractionText, unitText] = match as unknown as [string, string, string | undefined, string];
    if (/_$|__/.test(integerText) || /_$|__/.test(fractionText ?? '')) {
      return fail(`${source}: an underscore must sit between two digits`);
    }
    if (unitText === '') return fail(`${source}: the number ${integerText} needs a unit (d, h, m, s or ms)`);
    const unitKey = unitText.toLowerCase();
    if (unitKey === 'us' || unitKey === 'ns') {
      return fail(`${source}: "${unitText}" is finer than Rungwright's 1 ms resolution; use ms`);
    }
    const index = UNITS.findIndex((u) => u.unit === unitKey);
    if (index < 0) return fail(`${source}: unknown unit "${unitText}" (use d, h, m, s or ms)`);
    if (index === previousIndex) return fail(`${source}: unit "${unitKey}" appears twice`);
    if (index < previousIndex) return fail(`${source}: units out of order (largest first: d, h, m, s, ms)`);

    const spec = UNITS[index]!;
    const integer = Number(integerText.replaceAll('_', ''));
    if (partCount > 0 && integer >= spec.limit) {
      return fail(
        `${source}: ${integer}${unitKey} is more than one ${UNIT_NAMES[UNITS[index - 1]!.unit].slice(0, -1)}; ` +
          'only the first part of a duration may overflow',
      );
    }
    let partMs = integer * spec.ms;
    if (fractionText !== undefined) {
      sawFraction = true;
      const digits = fractionText.replaceAll('_', '');
      if (digits.length > 9) return fail(`${source}: too many digits after the decimal point`);
      const scaled = Number(digits) * spec.ms;
      const divisor = 10 ** digits.length;
      if (scaled % divisor !== 0) return fail(`${source}: Rungwright counts time in whole milliseconds`);
      partMs += scaled / divisor;
    }
    total += partMs;
    if (total > MAX_MS) return fail(`${source}: the duration is too long (at most T#366d)`);
    previousIndex = index;
    partCount += 1;
    rest = rest.slice(whole.length);
    if (rest === '' && whole.endsWith('_')) return fail(`${source}: a duration cannot end with "_"`);
  }
  return ok(sign * total || 0); // never -0 (T#-0s)
}

/**
 * Print milliseconds as the shortest duration literal: 1500 → `T#1s500ms`, 90000 → `T#1m30s`,
 * 0 → `T#0ms`. A fraction of a millisecond is rounded to the nearest millisecond.
 */
export function formatTime(ms: number): string {
  if (!Number.isFinite(ms)) return `T#${ms}`;
  let remaining = Math.round(Math.abs(ms));
  if (remaining === 0) return 'T#0ms';
  const parts: string[] = [];
  for (const { unit, ms: size } of UNITS) {
    const count = Math.floor(remaining / size);
    if (count > 0) parts.push(`${count}${unit}`);
    remaining -= count * size;
  }
  return `T#${ms < 0 ? '-' : ''}${parts.join('')}`;
}
