/**
 * Retained tags through PLCopen TC6 XML and the Structured Text view: TC6 marks retention on a
 * variable list (`<localVars retain="true">`, docs/published-values.md), IEC 61131-3 declares
 * them in a `VAR RETAIN` block.
 */
import { describe, expect, it } from 'vitest';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import { programToStructuredText } from '@shared/ladder/st';
import { updateTag } from '@shared/ladder/edits';
import { buildProgram, coil, no, par, rung } from '@shared/labs/build';
import type { Program } from '@shared/ladder/schema';

function sealedIn(): Program {
  return buildProgram('Retained seal-in', '', [
    { name: 'Start', address: '%IX2', comment: '' },
    { name: 'Run', address: '%MX1', comment: 'kept over a power loss', retain: true },
    { name: 'Lamp', address: '%QX4', comment: '' },
  ], [rung('', par(no('Start'), no('Run')), coil('Run')), rung('', no('Run'), coil('Lamp'))]);
}

describe('retain in PLCopen XML', () => {
  it('exports retained tags in a localVars list marked retain="true", the others in a plain one', () => {
    const xml = exportPlcopen(sealedIn(), { now: '2025-03-04T05:06:07Z' });
    expect(xml).toMatch(/<localVars retain="true">\s*<variable name="Run" address="%MX1">/);
    const plain = /<localVars>([\s\S]*?)<\/localVars>/.exec(xml)![1]!;
    expect(plain).toContain('name="Start"');
    expect(plain).not.toContain('name="Run"');
  });
  it('imports them back as retained tags, and only them', () => {
    const result = importPlcopen(exportPlcopen(sealedIn(), { now: '2025-03-04T05:06:07Z' }));
    if (!result.ok) throw new Error(result.error);
    const tags = result.value.program.tags;
    expect(tags.find((t) => t.name === 'Run')).toMatchObject({ address: '%MX1', retain: true });
    expect(tags.filter((t) => t.retain === true).map((t) => t.name)).toEqual(['Run']);
  });
});

describe('retain in the Structured Text view', () => {
  it('declares retained tags in a VAR RETAIN block', () => {
    const st = programToStructuredText(sealedIn());
    expect(st).toContain(['VAR RETAIN', '    Run AT %MX1 : BOOL; (* kept over a power loss *)', 'END_VAR'].join('\n'));
    expect(st).toContain(['VAR', '    Start AT %IX2 : BOOL;', '    Lamp AT %QX4 : BOOL;', 'END_VAR'].join('\n'));
  });
});

describe('updateTag and retain', () => {
  it('marks and unmarks a tag; not retained is written by leaving the flag out', () => {
    const doc = sealedIn();
    const plain = updateTag(doc, { name: 'Run', retain: false });
    expect(plain.tags[1]).toEqual({ name: 'Run', address: '%MX1', comment: 'kept over a power loss' });
    expect(updateTag(plain, { name: 'Run', retain: true }).tags[1]).toEqual(doc.tags[1]);
    expect(updateTag(doc, { name: 'Run', retain: true })).toBe(doc);
  });
});
