/**
 * How operands read in the text form and Structured Text: the program's tag name where one names
 * the address (`S1` rather than `%IX1`), the declared spelling of tags and instances, canonical
 * addresses; anything unresolvable is shown as typed (`?` when empty).
 */
import { formatAddress, parseAddress } from './addresses';
import { buildSymbolTable, IDENTIFIER, symbolKey, type SymbolTable } from './operands';
import type { Program } from './schema';

/** Looks up display names for one program. */
export interface NameView {
  symbols: SymbolTable;
  /** The text an operand is shown as. */
  display(text: string): string;
}

/** Build the name view of a program (tags are read once). */
export function createNameView(program: Program): NameView {
  const symbols = buildSymbolTable(program);
  const tagByAddress = new Map<string, string>();
  for (const tag of program.tags) {
    const parsed = parseAddress(tag.address);
    const key = symbolKey(tag.name);
    // Only the tag that owns its name (first declaration) names its address.
    if (parsed.ok && symbols.tags.has(key) && symbols.spellings.get(key) === tag.name) {
      const address = formatAddress(parsed.value);
      if (!tagByAddress.has(address)) tagByAddress.set(address, tag.name);
    }
  }
  return {
    symbols,
    display(text) {
      const source = text.trim();
      if (source === '') return '?';
      if (source.startsWith('%')) {
        const parsed = parseAddress(source);
        if (!parsed.ok) return source;
        const address = formatAddress(parsed.value);
        return tagByAddress.get(address) ?? address;
      }
      if (IDENTIFIER.test(source)) return symbols.spellings.get(symbolKey(source)) ?? source;
      const member = /^([A-Za-z_][A-Za-z0-9_]*)\.([A-Za-z_][A-Za-z0-9_]*)$/.exec(source);
      if (member) {
        const key = symbolKey(member[1]!);
        if (symbols.instances.has(key)) return `${symbols.spellings.get(key) ?? member[1]}.${member[2]!.toUpperCase()}`;
      }
      return source;
    },
  };
}
