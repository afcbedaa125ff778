import { describe, expect, it } from 'vitest';
import { DIAGNOSTICS, type Diagnostic, type DiagnosticCode } from '@shared/ladder/diagnostics';
import { validateProgram } from '@shared/ladder/validate';
import type { Program } from '@shared/ladder/schema';
import { CONVEYOR_TAGS, block, coil, nc, no, parallel, program, rung, series, tag, threeWireForward } from './fixtures';

const seen = new Set<DiagnosticCode>();

function check(doc: Program, space?: Parameters<typeof validateProgram>[1]): Diagnostic[] {
  const found = validateProgram(doc, space);
  for (const d of found) seen.add(d.code);
  return found;
}

function only(doc: Program, code: DiagnosticCode): Diagnostic {
  const found = check(doc).filter((d) => d.code === code);
  expect(found, `expected exactly one ${code}, got ${JSON.stringify(check(doc), null, 1)}`).toHaveLength(1);
  return found[0]!;
}

function withTags(...rungs: Parameters<typeof program>[0]): Program {
  return program(rungs, CONVEYOR_TAGS);
}

describe('validateProgram on correct programs', () => {
  it('finds nothing wrong with a three-wire forward start', () => {
    expect(check(threeWireForward())).toEqual([]);
  });

  it('accepts a final parallel driving two outputs, one behind its own contact', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), parallel('p1', coil('k1', 'K1'), series('s1', no('c2', 'B1'), coil('k2', 'H1')))));
    expect(check(doc)).toEqual([]);
  });

  it('accepts a timer in the middle of a rung feeding a coil, and a block ending a rung', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#3s' }), no('c2', 'S1'), coil('k1', 'H1')),
      rung('r2', no('c3', 'T1.Q'), block('b2', 'CTU', 'C1', { PV: '3', R: 'S1' })),
      rung('r3', no('c4', 'C1.Q'), coil('k2', 'P1')),
    );
    expect(check(doc)).toEqual([]);
  });

  it('accepts set and reset coils of one output in two rungs', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), coil('k1', 'K1', 'set')), rung('r2', nc('c2', 'S1'), coil('k2', 'K1', 'reset')));
    expect(check(doc)).toEqual([]);
  });
});

describe('operand messages', () => {
  it('reports an unknown tag with its place', () => {
    const d = only(withTags(rung('r1', no('c1', 'Strt'), coil('k1', 'K1'))), 'unknown-tag');
    expect(d).toMatchObject({ rungId: 'r1', path: [0], elementId: 'c1', severity: 'error' });
    expect(d.message).toBe('unknown tag "Strt" — add it to the tag table or use an address such as %IX2');
  });

  it('reports a malformed address', () => {
    expect(only(withTags(rung('r1', no('c1', '%IW1'), coil('k1', 'K1'))), 'address-invalid').message).toBe(
      '"%IW1": only bit addresses (%IX, %QX, %MX) are supported',
    );
  });

  it('reports an address outside the panel, and a tag pointing outside it', () => {
    const d = only(program([rung('r1', no('c1', '%IX9'), coil('k1', '%QX1'))]), 'address-out-of-range');
    expect(d.message).toBe('%IX9 is out of range: this panel has inputs %IX1..%IX8');
    const small = check(program([rung('r1', no('c1', '%IX3'), coil('k1', '%QX1'))]), { inputs: 2, outputs: 1, memory: 0 });
    expect(small.map((x) => x.message)).toEqual(['%IX3 is out of range: this panel has inputs %IX1..%IX2']);
  });

  it('reports a block output that does not exist', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s' })),
      rung('r2', no('c2', 'T1.QQ'), coil('k1', 'H1')),
    );
    expect(only(doc, 'unknown-member').message).toBe('"T1" has no member "QQ"; a TON has Q and ET');
  });

  it('reports other operands it cannot read', () => {
    expect(only(withTags(rung('r1', no('c1', 'T#5x'), coil('k1', 'K1'))), 'operand-invalid').message).toContain('unknown unit "x"');
  });

  it('reports a contact or coil left without an operand', () => {
    const doc = withTags(rung('r1', no('c1', ''), coil('k1', '  ')));
    const found = check(doc).filter((d) => d.code === 'operand-missing');
    expect(found.map((d) => [d.elementId, d.message])).toEqual([
      ['c1', 'this contact has no operand yet: type an address such as %IX1 or a tag name'],
      ['k1', 'this coil has no operand yet: type an address such as %IX1 or a tag name'],
    ]);
  });

  it('reports a contact on something that is not a bit', () => {
    const doc = withTags(
      rung('r1', no('c0', 'S2'), block('b1', 'CTU', 'C1', { PV: '3' })),
      rung('r2', no('c1', 'C1.CV'), coil('k1', 'H1')),
    );
    expect(only(doc, 'contact-not-bool').message).toBe('a contact examines a bit (TRUE/FALSE), but C1.CV is a number (an INT output)');
  });

  it('explains that a coil cannot write an input', () => {
    expect(only(program([rung('r1', no('c1', '%IX2'), coil('k1', '%IX1'))]), 'coil-on-input').message).toBe(
      'a coil cannot write an input: %IX1 is read from the field; use %QX or %MX',
    );
    expect(only(withTags(rung('r1', no('c1', 'S2'), coil('k1', 'S1'))), 'coil-on-input').message).toContain('%IX1 is read from the field');
  });

  it('refuses a coil on a block output or a constant', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s' })),
      rung('r2', no('c2', 'S2'), coil('k1', 'T1.Q')),
      rung('r3', no('c3', 'S2'), coil('k2', 'TRUE')),
    );
    const found = check(doc).filter((d) => d.code === 'coil-not-writable');
    expect(found.map((d) => d.message)).toEqual([
      'a coil writes an output or memory bit, but T1.Q is a block output, which only its block writes; use %QX or %MX',
      'a coil writes an output or memory bit, but TRUE is a constant; use %QX or %MX',
    ]);
  });
});

describe('rung shape messages', () => {
  it('reports a contact after a coil', () => {
    const d = only(withTags(rung('r1', no('c1', 'S2'), coil('k1', 'K1'), no('c2', 'S1'), coil('k2', 'H1'))), 'contact-after-coil');
    expect(d).toMatchObject({ elementId: 'c2', path: [2] });
    expect(d.message).toContain('the contact S1 comes after a coil');
  });

  it('reports a coil in the middle of a rung', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), coil('k1', 'K1'), block('b1', 'TON', 'T1', { PT: 'T#1s' })),
      rung('r2', no('c2', 'S2'), parallel('p1', coil('k2', 'H1'), no('c3', 'S3')), coil('k3', 'P1')),
    );
    const found = check(doc).filter((d) => d.code === 'coil-mid-rung');
    expect(found.map((d) => d.elementId)).toEqual(['k1', 'k2']);
    expect(found[0]!.message).toContain('the coil K1 sits in the middle of the rung');
  });

  it('reports an empty rung', () => {
    expect(only(withTags(rung('r1')), 'empty-rung').message).toBe('this rung is empty: add contacts and end it with a coil or a block');
  });

  it('reports an empty branch and explains the short circuit', () => {
    const d = only(withTags(rung('r1', parallel('p1', no('c1', 'S2'), series('s1')), coil('k1', 'K1'))), 'empty-branch');
    expect(d.path).toEqual([0, 1]);
    expect(d.message).toContain('joins its two ends directly');
  });

  it('reports an empty series or parallel group', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), series('s1'), parallel('p1'), coil('k1', 'K1')));
    const found = check(doc).filter((d) => d.code === 'empty-group');
    expect(found.map((d) => d.message)).toEqual(['this series holds nothing; delete it', 'this parallel branch holds nothing; delete it']);
  });

  it('reports a rung with no coil or block at its end', () => {
    expect(only(withTags(rung('r1', no('c1', 'S2'), no('c2', 'S1'))), 'rung-without-output').path).toEqual([]);
  });

  it('reports a final branch that drives nothing', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), parallel('p1', coil('k1', 'K1'), no('c2', 'S3'))));
    const d = only(doc, 'branch-without-output');
    expect(d.path).toEqual([1, 1]);
    expect(check(doc).some((x) => x.code === 'rung-without-output')).toBe(false);
  });
});

describe('coils driven twice', () => {
  it('warns that the last rung wins when two rungs drive one output, naming both rungs', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), coil('k1', 'K1')), rung('r2', no('c2', 'S3'), coil('k2', '%QX1')));
    const d = only(doc, 'duplicate-coil');
    expect(d).toMatchObject({ severity: 'warning', rungId: 'r2', elementId: 'k2' });
    expect(d.message).toMatch(/^%QX1 is also written by a coil in rung 1: .*last write wins, so rung 2 decides the output/);
  });

  it('warns once per rung, naming the rung that wrote the output last, and not for two coils of one rung', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), coil('k1', 'K1')),
      rung('r2', no('c2', 'S3'), parallel('p2', coil('k2', 'K1'), coil('k3', 'K1'))),
      rung('r3', no('c3', 'S2'), coil('k4', 'K1')),
      rung('r4', no('c4', 'S3'), parallel('p4', coil('k5', '%QX2'), coil('k6', '%QX2'))),
    );
    const found = check(doc).filter((d) => d.code === 'duplicate-coil');
    expect(found.map((d) => [d.elementId, d.path])).toEqual([['k2', [1, 0]], ['k4', [1]]]);
    expect(found[0]!.message).toMatch(/in rung 1: .*rung 2 decides/);
    expect(found[1]!.message).toMatch(/in rung 2: .*rung 3 decides/);
  });

  it('does not warn for one coil per rung or set/reset pairs', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), coil('k1', 'K1', 'set')), rung('r2', no('c2', 'S3'), coil('k2', 'K1', 'set')));
    expect(check(doc)).toEqual([]);
  });
});

describe('block messages', () => {
  it('reports a block without an instance name, and a name that is not an identifier', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', '', { PT: 'T#1s' })), rung('r2', no('c2', 'S2'), block('b2', 'CTU', '1C', { PV: '2' })));
    expect(only(doc, 'instance-missing')).toMatchObject({ field: 'instance', message: 'this TON has no instance name: name it, e.g. T1' });
    expect(only(doc, 'instance-bad-name').message).toContain('"1C" cannot name a block');
  });

  it('refuses an instance name that is a reserved word', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', 'AND', { PT: 'T#1s' })));
    expect(only(doc, 'instance-bad-name').message).toBe('"AND" cannot name a block: "AND" is a reserved word; choose another name');
  });

  it('reports an instance reused with another type', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s' })),
      rung('r2', no('c2', 'S3'), block('b2', 'CTU', 't1', { PV: '3' })),
    );
    expect(only(doc, 'instance-type-conflict').message).toBe(
      '"t1" is already a TON (rung 1); one instance name is one piece of memory, so it cannot also be a CTU: give this block another name',
    );
  });

  it('warns when one instance is called twice', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s' })),
      rung('r2', no('c2', 'S3'), block('b2', 'TON', 'T1', { PT: 'T#2s' })),
    );
    expect(only(doc, 'instance-called-twice').severity).toBe('warning');
  });

  it('reports a name used by a tag and a block', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', 'K1', { PT: 'T#1s' })));
    expect(only(doc, 'name-clash').message).toBe('"K1" names both a tag and a block instance; rename one of them');
  });

  it('reports timer presets that are missing, not a time, or negative', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1')),
      rung('r2', no('c2', 'S2'), block('b2', 'TOF', 'T2', { PT: '3' })),
      rung('r3', no('c3', 'S2'), block('b3', 'TP', 'T3', { PT: 'Three' })),
      rung('r4', no('c4', 'S2'), block('b4', 'TON', 'T4', { PT: 'T#-2s' })),
    );
    expect(only(doc, 'timer-preset-missing')).toMatchObject({ field: 'PT', message: 'timer T1 has no preset time: set PT, e.g. T#3s' });
    const notTime = check(doc).filter((d) => d.code === 'timer-preset-not-time');
    expect(notTime.map((d) => d.message)).toEqual([
      'timer T2\'s preset PT must be a duration such as T#3s, not "3"',
      'timer T3\'s preset PT must be a duration such as T#3s, not "Three"',
    ]);
    expect(only(doc, 'timer-preset-negative').message).toBe("timer T4's preset T#-2s is negative; a duration counts from zero up");
  });

  it('accepts another timer\'s elapsed time as a preset', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#5s' })),
      rung('r2', no('c2', 'S3'), block('b2', 'TON', 'T2', { PT: 'T1.ET' })),
    );
    expect(check(doc)).toEqual([]);
  });

  it('reports counter presets that are missing or not whole numbers', () => {
    const doc = withTags(
      rung('r1', no('c1', 'S2'), block('b1', 'CTU', 'C1')),
      rung('r2', no('c2', 'S2'), block('b2', 'CTD', 'C2', { PV: 'T#2s' })),
      rung('r3', no('c3', 'S2'), block('b3', 'CTUD', 'C3', { PV: 'S1' })),
    );
    expect(only(doc, 'counter-preset-missing').message).toBe('counter C1 has no preset value: set PV, e.g. 3');
    expect(check(doc).filter((d) => d.code === 'counter-preset-not-int').map((d) => d.elementId)).toEqual(['b2', 'b3']);
  });

  it('reports a BOOL block input given a number', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'CTU', 'C1', { PV: '3', R: '5' })));
    expect(only(doc, 'block-input-not-bool')).toMatchObject({ field: 'R', message: 'C1.R takes a bit (an address, a tag, TRUE or FALSE), not "5"' });
  });

  it('reports inputs the block type does not have', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s', PV: '3' })));
    expect(only(doc, 'block-input-unknown').message).toBe('a TON has no input "PV" (T1); its inputs are PT');
    // An empty leftover (from switching the block type) carries nothing, so it is not reported.
    expect(check(withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { PT: 'T#1s', PV: '' }))))).toEqual([]);
  });

  it('reports a power-flow input given as an operand', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), block('b1', 'TON', 'T1', { IN: 'S3', PT: 'T#1s' })));
    expect(only(doc, 'block-input-power-flow')).toMatchObject({ field: 'IN' });
    expect(only(doc, 'block-input-power-flow').message).toContain('T1.IN is fed by the rung on its left');
  });
});

describe('tag table messages', () => {
  it('reports bad and reserved tag names', () => {
    const doc = program([], [tag('Start', '%IX1'), tag('TRUE', '%IX2'), tag('a__b', '%IX3')]);
    const found = check(doc).filter((d) => d.code === 'tag-bad-name');
    expect(found.map((d) => d.path)).toEqual([[1], [2]]);
    expect(found[0]!.message).toBe('tag "TRUE": "TRUE" is a reserved word; choose another name');
  });

  it('reports a duplicate name, ignoring case', () => {
    const d = only(program([], [tag('Start', '%IX1'), tag('START', '%IX2')]), 'tag-duplicate-name');
    expect(d).toMatchObject({ rungId: null, path: [1], field: 'name' });
    expect(d.message).toBe('tag "START" is already declared in row 1 of the tag table (names ignore upper/lower case)');
  });

  it('reports bad, missing and out-of-range tag addresses', () => {
    const doc = program([], [tag('A', '%IW1'), tag('B', ''), tag('C', '%QX9')]);
    expect(check(doc).filter((d) => d.code === 'tag-bad-address').map((d) => d.message)).toEqual([
      'tag "A": "%IW1": only bit addresses (%IX, %QX, %MX) are supported',
      'tag "B": the tag has no address yet, e.g. %IX1',
      'tag "C": %QX9 is out of range: this panel has outputs %QX1..%QX6',
    ]);
  });

  it('warns about two tags for one address', () => {
    const d = only(program([], [tag('Start', '%IX2'), tag('Forward', '%ix2')]), 'tag-duplicate-address');
    expect(d).toMatchObject({ severity: 'warning', path: [1] });
    expect(d.message).toBe('tags "Start" and "Forward" both name %IX2; one name per bit is easier to read');
  });
});


describe('coils driven twice through a tag', () => {
  it('names the tag and its address in the warning', () => {
    const doc = withTags(rung('r1', no('c1', 'S2'), coil('k1', '%QX1')), rung('r2', no('c2', 'S3'), coil('k2', 'K1')));
    expect(validateProgram(doc).map((d) => d.message)[0]).toMatch(/^K1 \(%QX1\) is also written by a coil in rung 1/);
  });
});

describe('the diagnostic table', () => {
  // Runs last in this file (vitest runs a file's tests in order): every code was produced above.
  it('has no code that validation never produces', () => {
    const missing = Object.keys(DIAGNOSTICS).filter((code) => !seen.has(code as DiagnosticCode));
    expect(missing).toEqual([]);
  });
});
