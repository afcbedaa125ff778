import { describe, expect, it } from 'vitest';
import { builtInPanel } from '@shared/field/panels';
import { DEFAULT_ADDRESS_SPACE } from '@shared/ladder/addresses';
import { conveyorTags } from '@shared/labs/conveyorTags';
import { addressNames, filterOptions, operandOptions } from '@/editor/operandOptions';
import { program, rung, series, ton } from './fixtures';

const PANEL = builtInPanel('reversing-conveyor')!;
const doc = program([rung('r1', series('n', ton('t', 'T1')))], conveyorTags());

describe('operand suggestions', () => {
  it('name each address by its device on the panel in use', () => {
    const names = addressNames(PANEL);
    expect(names.get('%IX2')).toBe('S2 forward, green');
    expect(names.get('%IX1')).toBe('S1 stop, red');
    expect(names.get('%IX7')).toBe('K1 forward contactor 13-14');
    expect(names.get('%QX1')).toBe('K1 forward contactor coil');
    expect(names.get('%QX4')).toBe('P1 green lamp');
  });

  it('list tags with their address and device, then addresses with their device, then block outputs', () => {
    const options = operandOptions(doc, PANEL, DEFAULT_ADDRESS_SPACE);
    expect(options[1]).toEqual({ value: 'Fwd_PB', label: 'Fwd_PB — %IX2 · S2 forward, green' });
    expect(options).toContainEqual({ value: '%IX2', label: '%IX2 — S2 forward, green' });
    expect(options).toContainEqual({ value: '%MX1', label: '%MX1' });
    expect(options.at(-1)).toEqual({ value: 'T1.ET', label: 'T1.ET — TON output' });
  });

  it('offer a coil only what it can write: output and memory tags and addresses', () => {
    const values = operandOptions(doc, PANEL, DEFAULT_ADDRESS_SPACE, true).map((o) => o.value);
    expect(values.slice(0, 6)).toEqual(['K1_Coil', 'K2_Coil', 'Horn', 'Green_Lamp', 'Red_Lamp', 'Amber_Lamp']);
    expect(values.some((v) => v.startsWith('%IX') || v === 'Fwd_PB' || v.startsWith('T1.'))).toBe(false);
  });

  it('keep what is typed exactly above other hits, and find devices by their words', () => {
    const options = operandOptions(doc, PANEL, DEFAULT_ADDRESS_SPACE);
    expect(filterOptions(options, '%qx1')[0]!.value).toBe('%QX1');
    expect(filterOptions(options, 'green').map((o) => o.value)).toEqual(['Green_Lamp', 'Fwd_PB', '%IX2', '%QX4']);
    expect(filterOptions(options, '', 5)).toHaveLength(5);
  });
});
