/**
 * Transition-sensing coils -(P)- and -(N)-, IEC 61131-3:2013 clause 8.2.5 (coils; the positive
 * and negative transition-sensing coils beside the set and reset coils) [memory for the
 * sub-number], as docs/published-values.md summarises them: the variable is TRUE for one
 * evaluation when the power on the coil's left goes FALSE → TRUE (-(P)-) or TRUE → FALSE (-(N)-),
 * and FALSE otherwise. PLCopen TC6 XML 2.01 writes them as `<coil edge="rising|falling">`.
 * The edge memory starts FALSE, so power already on at the first scan is a rising transition
 * (common practice, as for the edge contacts).
 */
import { describe, expect, it } from 'vitest';
import { createRuntime } from '@shared/engine';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import { programToStructuredText } from '@shared/ladder/st';
import { rungText } from '@shared/ladder/text';
import type { CoilVariant } from '@shared/ladder/schema';
import { planOf, programBuilder } from '../unit/engine/build';

/** The value of the coil's variable after each scan, with the power on its left given per scan (%IX1). */
function run(variant: CoilVariant, power: boolean[]): boolean[] {
  const b = programBuilder();
  const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%MX1', variant)), b.rung(b.no('%MX1'), b.coil('%QX1'))])));
  return power.map((p) => {
    rt.setInput(1, p);
    rt.scan();
    // The second rung copies %MX1 in the same scan: a coil's write is seen at once (8.2.7).
    expect(rt.getOutput(1)).toBe(rt.read('%MX1'));
    return rt.read('%MX1') === true;
  });
}

const F = false;
const T = true;

describe('transition-sensing coils (IEC 61131-3:2013 8.2.5 [memory for the sub-number])', () => {
  const power = [F, T, T, T, F, F, T, F, T];
  it('-(P)- is TRUE for the one scan in which its power turns on', () => {
    expect(run('positive', power)).toEqual([F, T, F, F, F, F, T, F, T]);
  });
  it('-(N)- is TRUE for the one scan in which its power turns off', () => {
    expect(run('negative', power)).toEqual([F, F, F, F, T, F, F, T, F]);
  });
  it('power already on at the first scan is a rising transition (edge memory starts FALSE; common practice)', () => {
    expect(run('positive', [T, T])).toEqual([T, F]);
    expect(run('negative', [T, F, F])).toEqual([F, T, F]);
  });
  it('each coil keeps its own memory of the power: two -(P)- coils on different rungs see their own transitions', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%MX1', 'positive')), b.rung(b.no('%IX2'), b.coil('%MX2', 'positive'))])));
    const seen: string[] = [];
    for (const [a, c] of [[T, F], [T, T], [F, T], [T, F]] as const) {
      rt.setInput(1, a);
      rt.setInput(2, c);
      rt.scan();
      seen.push(`${rt.read('%MX1') ? 1 : 0}${rt.read('%MX2') ? 1 : 0}`);
    }
    expect(seen).toEqual(['10', '01', '00', '10']);
  });
});

describe('transition-sensing coils in the exchange formats', () => {
  const b = programBuilder();
  const doc = b.program([b.rung(b.no('%IX2'), b.coil('%QX4', 'positive')), b.rung(b.nc('%IX2'), b.coil('%QX5', 'negative'))]);
  it('PLCopen TC6 2.01: written as edge="rising" / edge="falling" on a coil, and read back', () => {
    const xml = exportPlcopen(doc, { now: '2025-03-04T05:06:07Z' });
    expect(xml).toMatch(/<coil [^>]*edge="rising"/);
    expect(xml).toMatch(/<coil [^>]*edge="falling"/);
    const back = importPlcopen(xml);
    if (!back.ok) throw new Error(back.error);
    const coils = back.value.program.rungs.map((r) => r.network.items.at(-1));
    expect(coils.map((c) => c?.kind === 'coil' && c.variant)).toEqual(['positive', 'negative']);
  });
  it('a coil both negated and edge-sensing is refused by name', () => {
    const xml = exportPlcopen(doc, { now: '2025-03-04T05:06:07Z' }).replace(/negated="false"([^>]*edge="rising")/, 'negated="true"$1');
    const back = importPlcopen(xml);
    expect(back.ok).toBe(false);
    if (!back.ok) expect(back.error).toMatch(/is both negated and edge="rising"/);
  });
  it('the Structured Text view reads them as R_TRIG / F_TRIG on the power flow', () => {
    const st = programToStructuredText(doc);
    expect(st).toContain('Rung1_Rise : R_TRIG;');
    expect(st).toContain('Rung1_Rise(CLK := %IX2);');
    expect(st).toContain('%QX4 := Rung1_Rise.Q;');
    expect(st).toContain('Rung2_Fall(CLK := NOT %IX2);');
  });
  it('the text form says RISING / FALLING before the coil', () => {
    expect(rungText(doc.rungs[0]!, doc)).toBe('%IX2 -> RISING %QX4');
    expect(rungText(doc.rungs[1]!, doc)).toBe('NOT %IX2 -> FALLING %QX5');
  });
});
