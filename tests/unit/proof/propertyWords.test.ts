import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';
import type { PanelLayout } from '@shared/field/layout';
import { conditionWords, propertyTitle, propertyWords } from '@/components/proof/propertyWords';

const ctx = { panel: REVERSING_CONVEYOR, tags: [{ name: 'Run_Flag', address: '%MX1' }] };

describe('a property in plain words, with the panel’s device names', () => {
  it('names the two contactors an interlock keeps apart', () => {
    expect(propertyWords({ never: { '%QX1': true, '%QX2': true } }, ctx)).toBe('K1 and K2 are never commanded together');
  });

  it('says "every output is off" while the e-stop is pressed when every driven output is named false', () => {
    const always = Object.fromEntries(['%QX1', '%QX2', '%QX3', '%QX4', '%QX5', '%QX6'].map((a) => [a, false]));
    expect(propertyWords({ always, when: { S0: 'pressed' } }, ctx)).toBe('while the e-stop is pressed, every output is off');
  });

  it('lists the outputs when only some are named', () => {
    expect(propertyWords({ always: { '%QX1': false, '%QX2': false }, when: { S0: 'pressed' } }, ctx)).toBe('while the e-stop is pressed, K1 and K2 are not commanded');
  });

  it('reads a response property as "after …, … within … ms"', () => {
    expect(propertyWords({ after: { S1: 'pressed' }, within: 100, expect: { K1: 'open' } }, ctx)).toBe('after S1 is pressed, K1 is open within 100 ms');
  });

  it('reads a reachability property as "can be"', () => {
    expect(propertyWords({ reachable: { P3: 'lit' } }, ctx)).toBe('P3 can be lit');
    expect(propertyWords({ reachable: { K1: 'closed', S4: 'JOG' } }, ctx)).toBe('it can happen that K1 is closed and S4 is JOG');
  });

  it('joins different states in a never with "at the same time"', () => {
    expect(propertyWords({ never: { K1: 'closed', S1: 'pressed' } }, ctx)).toBe('never at the same time: K1 is closed and S1 is pressed');
    expect(propertyWords({ never: { H1: 'sounding' } }, ctx)).toBe('H1 is never sounding');
  });

  it('names an input by the device that feeds it, a memory bit by its tag, a block value by its range', () => {
    expect(conditionWords({ '%IX7': false }, ctx)).toBe('input %IX7 (K1) is off');
    expect(conditionWords({ '%MX1': true }, ctx)).toBe('Run_Flag (%MX1) is on');
    expect(conditionWords({ 'T1.ET': { max: 2999 } }, ctx)).toBe('T1.ET is at most 2999');
    expect(conditionWords({ 'C1.CV': { min: 1, max: 3 } }, ctx)).toBe('C1.CV is between 1 and 3');
  });

  it('says "always" without a condition, and names an e-stop by id when a panel has two', () => {
    expect(propertyWords({ always: { P2: 'lit' } }, ctx)).toBe('always: P2 is lit');
    const two: PanelLayout = { ...REVERSING_CONVEYOR, devices: [...REVERSING_CONVEYOR.devices, { id: 'S9', kind: 'estop', label: 'Second e-stop', params: {}, through: [] } as PanelLayout['devices'][number]] };
    expect(propertyWords({ always: { '%QX1': false }, when: { S0: 'pressed' } }, { panel: two })).toBe('while S0 is pressed, K1 is not commanded');
  });

  it('shows the label first when the property has one', () => {
    expect(propertyTitle({ never: { '%QX1': true, '%QX2': true }, label: 'interlock' }, ctx)).toBe('interlock');
    expect(propertyTitle({ reachable: { P3: 'lit' } }, ctx)).toBe('P3 can be lit');
  });
});
