/**
 * IEC 61131-3 direct variables (clause 6.5.5 [memory for the number]): `%` + location prefix
 * (`I` input, `Q` output, `M` memory) + size prefix (`X` bit; no prefix also means a bit) + a
 * number. Rungwright's panels use bit addresses only, numbered from 1 as printed on the trainer
 * (`%IX1`..`%IX8`), and no hierarchical `.` parts.
 */
import { fail, ok, type Result } from './result';

/** Location prefix of a direct variable. */
export type Area = 'I' | 'Q' | 'M';

/** One bit of the input, output or memory image. */
export interface Address {
  area: Area;
  /** 1-based, as printed: `%IX1` has index 1. */
  index: number;
}

/** How many bits of each area a panel offers. */
export interface AddressSpace {
  inputs: number;
  outputs: number;
  memory: number;
}

/** The default `reversing-conveyor` panel (docs/names-and-rules.md): 8 inputs, 6 outputs, 64 memory bits. */
export const DEFAULT_ADDRESS_SPACE: AddressSpace = Object.freeze({ inputs: 8, outputs: 6, memory: 64 });

const AREAS = {
  I: { size: 'inputs', noun: 'inputs' },
  Q: { size: 'outputs', noun: 'outputs' },
  M: { size: 'memory', noun: 'memory bits' },
} as const satisfies Record<Area, { size: keyof AddressSpace; noun: string }>;

export const AREA_ORDER: readonly Area[] = ['I', 'Q', 'M'];

/** Parse `%IX1`, `%qx2`, `%MX10` (any case; `%I1` is the same bit as `%IX1`). */
export function parseAddress(text: string): Result<Address> {
  const source = text.trim();
  if (!source.startsWith('%')) return fail(`"${source}" is not an address: an address starts with "%", e.g. %IX1`);
  const match = /^%([A-Za-z])([A-Za-z]?)([0-9][0-9.]*)?$/.exec(source);
  if (!match) return fail(`"${source}" is not an address: write it like %IX1, %QX2 or %MX10`);
  const [, areaLetter, sizeLetter, numberText] = match as unknown as [string, string, string, string | undefined];
  const area = areaLetter.toUpperCase();
  if (!isArea(area)) {
    return fail(`"${source}": unknown area "${areaLetter}"; use %I (inputs), %Q (outputs) or %M (memory)`);
  }
  const size = sizeLetter.toUpperCase();
  if (size !== '' && size !== 'X') {
    return fail(`"${source}": only bit addresses (%IX, %QX, %MX) are supported`);
  }
  if (numberText === undefined) return fail(`"${source}": the address needs a number, e.g. %${area}X1`);
  if (numberText.includes('.')) {
    return fail(`"${source}": hierarchical addresses are not used here; number bits from 1, e.g. %${area}X1`);
  }
  const index = Number(numberText);
  if (index === 0) return fail(`"${source}": numbering starts at 1 (%${area}X1)`);
  if (!Number.isSafeInteger(index)) return fail(`"${source}": the address number is too large`);
  return ok({ area, index });
}

function isArea(letter: string): letter is Area {
  return letter === 'I' || letter === 'Q' || letter === 'M';
}

/** How many bits the space offers in an area. */
export function areaSize(area: Area, space: AddressSpace): number {
  return space[AREAS[area].size];
}

/**
 * `null` when the address exists on the panel, otherwise the message a student reads:
 * `%IX9 is out of range: this panel has inputs %IX1..%IX8`.
 */
export function addressInRange(a: Address, space: AddressSpace): string | null {
  const size = areaSize(a.area, space);
  if (a.index >= 1 && a.index <= size) return null;
  const noun = AREAS[a.area].noun;
  if (size === 0) return `${formatAddress(a)} is out of range: this panel has no ${noun}`;
  const range = size === 1 ? `%${a.area}X1` : `%${a.area}X1..%${a.area}X${size}`;
  return `${formatAddress(a)} is out of range: this panel has ${noun} ${range}`;
}

/** The canonical spelling: `%IX1`. */
export function formatAddress(a: Address): string {
  return `%${a.area}X${a.index}`;
}

/** True when both name the same bit. */
export function sameAddress(a: Address, b: Address): boolean {
  return a.area === b.area && a.index === b.index;
}

/** Every address of the space, inputs then outputs then memory, for autocomplete. */
export function allAddresses(space: AddressSpace): string[] {
  const list: string[] = [];
  for (const area of AREA_ORDER) {
    const size = areaSize(area, space);
    for (let index = 1; index <= size; index += 1) list.push(formatAddress({ area, index }));
  }
  return list;
}
