import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';
import type { PanelLayout } from '@shared/field/layout';
import { PropertySchema } from '@shared/proof';
import { estopClears, guessStop, nameableDevices, neverTogether, outputChoices, reachable, responds, stopWins } from '@/components/proof/propertyTemplates';
import { parsePropertyText } from '@/components/proof/propertyJson';

const panel = REVERSING_CONVEYOR;

describe('templates built from the panel layout', () => {
  it('offers the outputs that drive a device, contactors first', () => {
    const choices = outputChoices(panel);
    expect(choices.slice(0, 2).map((c) => [c.address, c.device])).toEqual([
      ['%QX1', 'K1'],
      ['%QX2', 'K2'],
    ]);
    expect(choices.map((c) => c.device)).toEqual(['K1', 'K2', 'H1', 'P1', 'P2', 'P3']);
  });

  it('leaves out the motor (its speed is not modelled) and the interlock, and gives each device its state words', () => {
    const devices = nameableDevices(panel);
    expect(devices.map((d) => d.device.id)).not.toContain('M1');
    expect(devices.map((d) => d.device.id)).not.toContain('R1');
    expect(devices.find((d) => d.device.id === 'S4')?.words).toEqual(['JOG', 'RUN']);
    expect(devices.find((d) => d.device.id === 'K1')?.words).toEqual(['open', 'closed']);
  });

  it('takes the NC pushbutton as the stop', () => {
    expect(guessStop(panel)).toBe('S1');
  });

  it('builds each template into a property the schema accepts', () => {
    const built = [
      neverTogether('%QX1', '%QX2'),
      estopClears(panel, ['%QX1', '%QX2']),
      stopWins('S1', 'S2', '%QX1'),
      reachable({ device: 'P3', word: 'lit' }),
      responds({ device: 'S1', word: 'pressed' }, 100, { device: 'K1', word: 'open' }),
    ];
    const properties = built.map((b) => (b.ok ? b.property : null));
    expect(properties).toEqual([
      { never: { '%QX1': true, '%QX2': true } },
      { always: { '%QX1': false, '%QX2': false }, when: { S0: 'pressed' } },
      { always: { '%QX1': false }, when: { S1: 'pressed', S2: 'pressed' } },
      { reachable: { P3: 'lit' } },
      { after: { S1: 'pressed' }, within: 100, expect: { K1: 'open' } },
    ]);
    for (const p of properties) expect(PropertySchema.safeParse(p).success).toBe(true);
  });

  it('refuses choices that make no property, saying why', () => {
    expect(neverTogether('%QX1', '%QX1')).toEqual({ ok: false, error: 'Pick two different outputs.' });
    expect(stopWins('S1', 'S1', '%QX1')).toEqual({ ok: false, error: 'The stop and start buttons must be two different buttons.' });
    expect(estopClears(panel, [])).toEqual({ ok: false, error: 'Pick at least one output.' });
    expect(responds({ device: 'S1', word: 'pressed' }, -5, { device: 'K1', word: 'open' })).toEqual({ ok: false, error: 'The time is a whole number of ms, 0 or more.' });
    const noEstop: PanelLayout = { ...panel, devices: panel.devices.filter((d) => d.kind !== 'estop'), inputCommon: [], outputCommon: [] };
    expect(estopClears(noEstop, ['%QX1'])).toEqual({ ok: false, error: 'This panel has no e-stop.' });
  });
});

describe('the advanced JSON field', () => {
  it('accepts a property and gives it back as data', () => {
    expect(parsePropertyText('{ "reachable": { "P3": "lit" }, "label": "amber" }')).toEqual({ ok: true, property: { reachable: { P3: 'lit' }, label: 'amber' } });
  });

  it('says where the JSON breaks, as line and column', () => {
    const parsed = parsePropertyText('{\n  "never": { "%QX1": true, }\n}');
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors[0]).toMatch(/^line 2, column \d+: /);
  });

  it('names the field that is wrong', () => {
    const parsed = parsePropertyText('{ "after": { "S1": "pressed" }, "within": -1, "expect": { "K1": "open" } }');
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors[0]).toMatch(/^within: /);
    const unknown = parsePropertyText('{ "never": { "%QX1": true }, "colour": "red" }');
    expect(unknown.ok).toBe(false);
    if (!unknown.ok) expect(unknown.errors.join(' ')).toMatch(/colour/);
  });

  it('asks for one kind, and for an object', () => {
    expect(parsePropertyText('{ "never": { "%QX1": true }, "reachable": { "P3": "lit" } }')).toEqual({ ok: false, errors: ['one kind per property, got "never" and "reachable"'] });
    expect(parsePropertyText('[1]')).toEqual({ ok: false, errors: ['a property is an object such as { "reachable": { "P3": "lit" } }'] });
    expect(parsePropertyText('{ "sometimes": {} }')).toEqual({ ok: false, errors: ['a property has one of "never", "always", "after" or "reachable"'] });
    expect(parsePropertyText('  ').ok).toBe(false);
  });
});
