import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ADDRESS_SPACE,
  addressInRange,
  allAddresses,
  formatAddress,
  parseAddress,
} from '@shared/ladder/addresses';

function parsed(text: string) {
  const result = parseAddress(text);
  if (!result.ok) throw new Error(result.error);
  return result.value;
}

function refused(text: string): string {
  const result = parseAddress(text);
  if (result.ok) throw new Error(`expected ${text} to be refused`);
  return result.error;
}

describe('parseAddress', () => {
  it('reads bit addresses of each area in any case', () => {
    expect(parsed('%IX1')).toEqual({ area: 'I', index: 1 });
    expect(parsed('%qx2')).toEqual({ area: 'Q', index: 2 });
    expect(parsed('%MX10')).toEqual({ area: 'M', index: 10 });
    expect(parsed(' %Ix8 ')).toEqual({ area: 'I', index: 8 });
  });

  it('treats an address without size prefix as a bit', () => {
    expect(parsed('%I3')).toEqual({ area: 'I', index: 3 });
  });

  it('refuses word, byte and double-word addresses', () => {
    expect(refused('%IW1')).toBe('"%IW1": only bit addresses (%IX, %QX, %MX) are supported');
    expect(refused('%MB4')).toContain('only bit addresses');
    expect(refused('%QD1')).toContain('only bit addresses');
  });

  it('says what is wrong with other malformed addresses', () => {
    expect(refused('IX1')).toBe('"IX1" is not an address: an address starts with "%", e.g. %IX1');
    expect(refused('%AX1')).toContain('unknown area "A"');
    expect(refused('%IX')).toBe('"%IX": the address needs a number, e.g. %IX1');
    expect(refused('%IX0')).toBe('"%IX0": numbering starts at 1 (%IX1)');
    expect(refused('%IX1.2')).toContain('hierarchical addresses are not used here');
    expect(refused('%IX1a')).toContain('write it like %IX1');
  });
});

describe('addressInRange', () => {
  it('accepts every address of the default panel', () => {
    for (const text of allAddresses(DEFAULT_ADDRESS_SPACE)) {
      expect(addressInRange(parsed(text), DEFAULT_ADDRESS_SPACE)).toBeNull();
    }
  });

  it('names the panel range when an address is outside it', () => {
    expect(addressInRange(parsed('%IX9'), DEFAULT_ADDRESS_SPACE)).toBe(
      '%IX9 is out of range: this panel has inputs %IX1..%IX8',
    );
    expect(addressInRange(parsed('%QX7'), DEFAULT_ADDRESS_SPACE)).toBe(
      '%QX7 is out of range: this panel has outputs %QX1..%QX6',
    );
    expect(addressInRange(parsed('%MX65'), DEFAULT_ADDRESS_SPACE)).toBe(
      '%MX65 is out of range: this panel has memory bits %MX1..%MX64',
    );
  });

  it('says so when a panel has none of an area', () => {
    expect(addressInRange(parsed('%MX1'), { inputs: 2, outputs: 1, memory: 0 })).toBe(
      '%MX1 is out of range: this panel has no memory bits',
    );
    expect(addressInRange(parsed('%QX2'), { inputs: 2, outputs: 1, memory: 0 })).toBe(
      '%QX2 is out of range: this panel has outputs %QX1',
    );
  });
});

describe('formatAddress and allAddresses', () => {
  it('prints the canonical spelling', () => {
    expect(formatAddress({ area: 'Q', index: 3 })).toBe('%QX3');
    expect(formatAddress(parsed('%i5'))).toBe('%IX5');
  });

  it('lists inputs, outputs then memory of the default panel', () => {
    const list = allAddresses(DEFAULT_ADDRESS_SPACE);
    expect(list).toHaveLength(8 + 6 + 64);
    expect(list.slice(0, 9)).toEqual(['%IX1', '%IX2', '%IX3', '%IX4', '%IX5', '%IX6', '%IX7', '%IX8', '%QX1']);
    expect(list.at(-1)).toBe('%MX64');
  });
});
