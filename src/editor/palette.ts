/**
 * The palette: every element a student can place, with its name (docs/names-and-rules.md, "Names"), the IEC
 * 61131-3 graphic symbol it is drawn as, and the key that inserts it at the selected drop slot.
 */
import { BLOCK_SPECS, BLOCK_TYPES } from '@shared/ladder/blocks';
import type { BlockType, CoilVariant, ContactVariant } from '@shared/ladder/schema';

export type PaletteItem =
  | { kind: 'contact'; variant: ContactVariant; key: string; name: string; symbol: string; shortcut: string; hint: string }
  | { kind: 'coil'; variant: CoilVariant; key: string; name: string; symbol: string; shortcut: string; hint: string }
  | { kind: 'block'; type: BlockType; key: string; name: string; symbol: string; shortcut: string; hint: string };

const CONTACT_ITEMS = {
  no: { name: 'NO contact', symbol: '| |', shortcut: 'C', hint: 'Passes power while its bit is TRUE.' },
  nc: { name: 'NC contact', symbol: '|/|', shortcut: 'Shift+C', hint: 'Passes power while its bit is FALSE.' },
  rising: { name: 'Rising-edge contact', symbol: '|P|', shortcut: 'P', hint: 'Passes power for one scan when its bit turns TRUE.' },
  falling: { name: 'Falling-edge contact', symbol: '|N|', shortcut: 'N', hint: 'Passes power for one scan when its bit turns FALSE.' },
} as const satisfies Record<ContactVariant, { name: string; symbol: string; shortcut: string; hint: string }>;

const COIL_ITEMS = {
  coil: { name: 'Coil', symbol: '( )', shortcut: 'O', hint: 'Writes the power reaching it to its bit.' },
  negated: { name: 'Negated coil', symbol: '(/)', shortcut: 'Shift+O', hint: 'Writes the inverse of the power reaching it.' },
  set: { name: 'Set coil', symbol: '(S)', shortcut: 'S', hint: 'Sets its bit TRUE while powered; otherwise leaves it.' },
  reset: { name: 'Reset coil', symbol: '(R)', shortcut: 'R', hint: 'Resets its bit FALSE while powered; otherwise leaves it.' },
  positive: { name: 'Rising-power coil', symbol: '(P)', shortcut: '', hint: 'Turns its bit TRUE for one scan when the power reaching it turns on.' },
  negative: { name: 'Falling-power coil', symbol: '(N)', shortcut: '', hint: 'Turns its bit TRUE for one scan when the power reaching it turns off.' },
} as const satisfies Record<CoilVariant, { name: string; symbol: string; shortcut: string; hint: string }>;

/** Keys for the blocks used most in motor control; the rest are reached from the palette list. */
const BLOCK_SHORTCUTS: Partial<Record<BlockType, string>> = { TON: 'T', CTU: 'U' };

/** Every palette item in display order: contacts, coils, then the standard function blocks. */
export const PALETTE: readonly PaletteItem[] = [
  ...(Object.entries(CONTACT_ITEMS) as [ContactVariant, (typeof CONTACT_ITEMS)[ContactVariant]][]).map(
    ([variant, item]) => ({ kind: 'contact' as const, variant, key: `contact:${variant}`, ...item }),
  ),
  ...(Object.entries(COIL_ITEMS) as [CoilVariant, (typeof COIL_ITEMS)[CoilVariant]][]).map(([variant, item]) => ({
    kind: 'coil' as const,
    variant,
    key: `coil:${variant}`,
    ...item,
  })),
  ...BLOCK_TYPES.map((type) => ({
    kind: 'block' as const,
    type,
    key: `block:${type}`,
    name: type,
    symbol: type,
    shortcut: BLOCK_SHORTCUTS[type] ?? '',
    hint: BLOCK_SPECS[type].summary,
  })),
];

/** The palette item with this key, e.g. `contact:no`, `block:TON`. */
export function paletteItem(key: string): PaletteItem | undefined {
  return PALETTE.find((item) => item.key === key);
}

/** The name of a contact or coil variant as shown in the inspector. */
export function variantName(kind: 'contact' | 'coil', variant: string): string {
  const table: Record<string, { name: string }> = kind === 'contact' ? CONTACT_ITEMS : COIL_ITEMS;
  return table[variant]?.name ?? variant;
}

export const CONTACT_VARIANTS = Object.keys(CONTACT_ITEMS) as ContactVariant[];
export const COIL_VARIANTS = Object.keys(COIL_ITEMS) as CoilVariant[];
