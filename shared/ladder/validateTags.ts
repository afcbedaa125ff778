/**
 * Checks on the tag table: names that are identifiers and not keywords, no name twice (names
 * ignore case, as IEC 61131-3 identifiers do), addresses that parse and exist on the panel, and a
 * warning when two tags name one bit.
 */
import { addressInRange, formatAddress, parseAddress, type AddressSpace } from './addresses';
import { createDiagnostic, type Diagnostic } from './diagnostics';
import { IDENTIFIER, RESERVED_WORDS, symbolKey } from './operands';
import type { Tag } from './schema';

/** Why a name cannot be a tag or instance name, or null when it can. */
export function nameProblem(name: string): string | null {
  if (!IDENTIFIER.test(name)) return 'a name starts with a letter or "_" and uses only letters, digits and "_"';
  if (name.includes('__')) return 'IEC 61131-3 does not allow two underscores in a row in a name';
  if (name.length > 32) return 'a name is at most 32 characters';
  if (RESERVED_WORDS.has(name.toUpperCase())) return `"${name}" is a reserved word; choose another name`;
  return null;
}

/** Diagnostics for the tag table; each points at `[tagIndex]` with `field` `name` or `address`. */
export function validateTags(tags: readonly Tag[], space: AddressSpace): Diagnostic[] {
  const found: Diagnostic[] = [];
  const firstByName = new Map<string, number>();
  const firstByAddress = new Map<string, string>();
  tags.forEach((tag, index) => {
    const where = (field: string) => ({ rungId: null, path: [index], elementId: null, field });
    const problem = nameProblem(tag.name);
    if (problem !== null) found.push(createDiagnostic('tag-bad-name', { name: tag.name, reason: problem }, where('name')));
    const key = symbolKey(tag.name);
    const first = firstByName.get(key);
    if (first !== undefined) {
      found.push(createDiagnostic('tag-duplicate-name', { name: tag.name, first: first + 1 }, where('name')));
    } else {
      firstByName.set(key, index);
    }
    const parsed = parseAddress(tag.address);
    if (!parsed.ok) {
      const reason = tag.address.trim() === '' ? 'the tag has no address yet, e.g. %IX1' : parsed.error;
      found.push(createDiagnostic('tag-bad-address', { name: tag.name, reason }, where('address')));
      return;
    }
    const range = addressInRange(parsed.value, space);
    if (range !== null) {
      found.push(createDiagnostic('tag-bad-address', { name: tag.name, reason: range }, where('address')));
      return;
    }
    const address = formatAddress(parsed.value);
    const other = firstByAddress.get(address);
    if (other !== undefined && symbolKey(other) !== key) {
      found.push(createDiagnostic('tag-duplicate-address', { name: tag.name, address, other }, where('address')));
    } else if (other === undefined) {
      firstByAddress.set(address, tag.name);
    }
  });
  return found;
}
