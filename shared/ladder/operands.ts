/**
 * What an operand's text means. A contact, coil or block input holds text (`%IX1`, `Start`,
 * `T1.Q`, `T#2s`, `3`, `TRUE`); `resolveOperand` turns it into a typed `Operand` against the
 * program's symbols, or a message a student understands.
 *
 * Names are case-insensitive, as IEC 61131-3 identifiers are (clause 6.1.2 [memory]): `start`,
 * `Start` and `START` are one tag. The symbol table is therefore keyed by `symbolKey(name)`, the
 * upper-case spelling; look names up through it.
 */
import { BLOCK_SPECS } from './blocks';
import { formatAddress, parseAddress, type Address } from './addresses';
import { fail, ok, type Result } from './result';
import type { BlockType, NetworkNode, Program } from './schema';
import { looksLikeTimeLiteral, parseTimeLiteral } from './time';

/** A resolved operand. */
export type Operand =
  /** A bit of the I/Q/M image: written as an address, or through a tag (then `tag` is its declared name). */
  | { kind: 'bit'; address: Address; tag?: string }
  /** An output of a block instance: `T1.Q`, `C1.CV`. `instance` is the symbol key (upper case), `member` the formal name. */
  | { kind: 'member'; instance: string; member: string }
  /** A duration constant in ms (may be negative: validation says so). */
  | { kind: 'time'; ms: number }
  /** An integer constant. */
  | { kind: 'int'; value: number }
  /** `TRUE` / `FALSE`. */
  | { kind: 'bool'; value: boolean };

export type OperandKind = Operand['kind'];

/** The names a program declares. */
export interface SymbolTable {
  /** Tag address by symbol key (upper-case name). Tags whose address does not parse are in `invalidTags` instead. */
  tags: ReadonlyMap<string, Address>;
  /** Block instance type by symbol key; the first declaration wins. */
  instances: ReadonlyMap<string, BlockType>;
  /** Declared spelling by symbol key, for tags and instances (first one wins), for messages. */
  spellings: ReadonlyMap<string, string>;
  /** Tags whose address is unusable, by symbol key, with the address error. */
  invalidTags: ReadonlyMap<string, string>;
}

/** The key a name is stored under: IEC identifiers are case-insensitive. */
export function symbolKey(name: string): string {
  return name.trim().toUpperCase();
}

/** A plain IEC identifier: a letter or `_`, then letters, digits and `_`. */
export const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

/**
 * Words a tag or instance cannot be named, because the text form or Structured Text would read
 * them as something else (IEC 61131-3 keywords used by Rungwright, plus the type names).
 */
export const RESERVED_WORDS: ReadonlySet<string> = new Set([
  'TRUE', 'FALSE', 'AND', 'OR', 'XOR', 'NOT', 'MOD', 'RISING', 'FALLING', 'SET', 'RESET',
  'IF', 'THEN', 'ELSE', 'ELSIF', 'END_IF', 'PROGRAM', 'END_PROGRAM', 'VAR', 'END_VAR', 'AT',
  'BOOL', 'INT', 'TIME', 'R_EDGE', 'F_EDGE',
  ...Object.keys(BLOCK_SPECS),
]);

/**
 * Symbol tables already built, per document object: documents are immutable and a table is
 * read-only, so validation and the engine's lowering of the same document share one.
 */
const symbolTables = new WeakMap<Program, SymbolTable>();

/** Collect the tags and block instances of a program (once per document object). */
export function buildSymbolTable(program: Program): SymbolTable {
  const known = symbolTables.get(program);
  if (known !== undefined) return known;
  const tags = new Map<string, Address>();
  const invalidTags = new Map<string, string>();
  const instances = new Map<string, BlockType>();
  const spellings = new Map<string, string>();
  for (const tag of program.tags) {
    const key = symbolKey(tag.name);
    if (tags.has(key) || invalidTags.has(key)) continue;
    const parsed = parseAddress(tag.address);
    if (parsed.ok) tags.set(key, parsed.value);
    else invalidTags.set(key, parsed.error);
    spellings.set(key, tag.name);
  }
  // Blocks in document order (rung by rung, depth first), without building a path per node.
  const visit = (node: NetworkNode): void => {
    if (node.kind === 'series') for (const item of node.items) visit(item);
    else if (node.kind === 'parallel') for (const branch of node.branches) visit(branch);
    else if (node.kind === 'block' && node.instance.trim() !== '') {
      const key = symbolKey(node.instance);
      if (instances.has(key)) return;
      instances.set(key, node.type);
      if (!spellings.has(key)) spellings.set(key, node.instance.trim());
    }
  };
  for (const rung of program.rungs) visit(rung.network);
  const table: SymbolTable = { tags, instances, spellings, invalidTags };
  symbolTables.set(program, table);
  return table;
}

/** Integer literals: decimal with `_`, or `2#`, `8#`, `16#` based (IEC 61131-3 clause 6.3.2, Table 5 [memory]). */
function parseInteger(text: string): Result<number> | null {
  const based = /^(2|8|16)#(.*)$/.exec(text);
  if (based) {
    const [, baseText, digitsText] = based as unknown as [string, string, string];
    const base = Number(baseText);
    const digits = digitsText.replaceAll('_', '');
    const allowed = base === 2 ? /^[01]+$/ : base === 8 ? /^[0-7]+$/ : /^[0-9A-Fa-f]+$/;
    if (digits === '' || !allowed.test(digits)) return fail(`${text}: not a base-${base} number`);
    return checkedInteger(text, parseInt(digits, base));
  }
  if (/^[+-]?[0-9][0-9_]*$/.test(text)) {
    if (text.endsWith('_') || text.includes('__')) return fail(`${text}: an underscore must sit between two digits`);
    return checkedInteger(text, Number(text.replaceAll('_', '')));
  }
  return null;
}

/** INT is 16-bit in IEC 61131-3 (Table 10 [memory]); the counters' CV and PV are INT. */
const INT_MIN = -32768;
const INT_MAX = 32767;

function checkedInteger(text: string, value: number): Result<number> {
  if (value < INT_MIN || value > INT_MAX) return fail(`${text}: an INT lies between ${INT_MIN} and ${INT_MAX}`);
  return ok(value);
}

/** Distance between two names, for "did you mean" hints (Levenshtein, case-insensitive). */
function editDistance(a: string, b: string): number {
  const x = a.toUpperCase();
  const y = b.toUpperCase();
  let previous = Array.from({ length: y.length + 1 }, (_, j) => j);
  for (let i = 1; i <= x.length; i += 1) {
    const current = [i];
    for (let j = 1; j <= y.length; j += 1) {
      const cost = x[i - 1] === y[j - 1] ? 0 : 1;
      current.push(Math.min(previous[j]! + 1, current[j - 1]! + 1, previous[j - 1]! + cost));
    }
    previous = current;
  }
  return previous[y.length]!;
}

/** The closest declared tag name within two edits, if any. */
export function suggestTag(name: string, symbols: SymbolTable): string | null {
  let best: string | null = null;
  let bestDistance = 3;
  for (const key of [...symbols.tags.keys(), ...symbols.invalidTags.keys()]) {
    const distance = editDistance(name, key);
    if (distance < bestDistance) {
      bestDistance = distance;
      best = symbols.spellings.get(key) ?? key;
    }
  }
  return best;
}

function listNames(names: readonly string[]): string {
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

function resolveMember(text: string, symbols: SymbolTable): Result<Operand> {
  const [instanceText, memberText, ...extra] = text.split('.') as [string, string, ...string[]];
  if (extra.length > 0 || !IDENTIFIER.test(instanceText) || !IDENTIFIER.test(memberText)) {
    return fail(`"${text}" is not a block output: write it like T1.Q or C1.CV`);
  }
  const key = symbolKey(instanceText);
  const type = symbols.instances.get(key);
  if (type === undefined) {
    if (symbols.tags.has(key)) return fail(`"${instanceText}" is a tag, not a block, so it has no member "${memberText}"`);
    return fail(`"${instanceText}" is not a block in this program: add a block named ${instanceText} to use ${text}`);
  }
  const spec = BLOCK_SPECS[type];
  const outputs = spec.outputs.map((p) => p.name);
  const member = memberText.toUpperCase();
  if (outputs.includes(member)) return ok({ kind: 'member', instance: key, member });
  const name = symbols.spellings.get(key) ?? instanceText;
  const article = /^[AEFHILMNORSX]/.test(type) ? 'an' : 'a';
  if (spec.inputs.some((p) => p.name === member)) {
    return fail(`"${name}.${member}" is an input of the ${type}; only its outputs ${listNames(outputs)} can be read`);
  }
  return fail(`"${name}" has no member "${memberText}"; ${article} ${type} has ${listNames(outputs)}`);
}

/** The symbol table last asked about in `operandResolutions`, and its texts' resolutions. */
let resolutionsTable: SymbolTable | null = null;
let resolutions = new Map<string, Result<Operand>>();

/**
 * A cache of `resolveOperand` for one symbol table (the caller fills it): validation and lowering
 * of the same document then resolve each distinct operand text once between them (a 1,000-rung
 * program repeats about 1,200 texts; resolving them cost 2-5 ms in a fresh process). Kept for the
 * last table asked about only, so the documents of an edit history keep nothing more alive.
 */
export function operandResolutions(symbols: SymbolTable): Map<string, Result<Operand>> {
  if (symbols !== resolutionsTable) {
    resolutionsTable = symbols;
    resolutions = new Map();
  }
  return resolutions;
}

/**
 * Resolve an operand's text. Addresses are parsed but not range-checked (the panel decides the
 * range; see `addressInRange`).
 */
export function resolveOperand(text: string, symbols: SymbolTable): Result<Operand> {
  const source = text.trim();
  if (source === '') return fail('no operand given: type an address such as %IX1, a tag name or a constant');
  if (source.startsWith('%')) {
    const address = parseAddress(source);
    return address.ok ? ok({ kind: 'bit', address: address.value }) : address;
  }
  if (looksLikeTimeLiteral(source)) {
    const ms = parseTimeLiteral(source);
    return ms.ok ? ok({ kind: 'time', ms: ms.value }) : ms;
  }
  const upper = source.toUpperCase();
  if (upper === 'TRUE' || upper === 'FALSE') return ok({ kind: 'bool', value: upper === 'TRUE' });
  const integer = parseInteger(source);
  if (integer !== null) return integer.ok ? ok({ kind: 'int', value: integer.value }) : integer;
  if (/^[+-]?[0-9]*\.[0-9]+$/.test(source) || /^[+-]?[0-9]+\.[0-9]*$/.test(source)) {
    return fail(`${source}: decimal numbers are not used here; use an integer, or a duration such as T#1.5s`);
  }
  if (source.includes('.')) return resolveMember(source, symbols);
  if (!IDENTIFIER.test(source)) {
    return fail(
      `"${source}" is not a valid operand: use an address (%IX1), a tag name, a block output (T1.Q) or a constant (T#2s, 3, TRUE)`,
    );
  }
  const key = symbolKey(source);
  const address = symbols.tags.get(key);
  if (address !== undefined) return ok({ kind: 'bit', address, tag: symbols.spellings.get(key) ?? source });
  const broken = symbols.invalidTags.get(key);
  if (broken !== undefined) return fail(`tag "${source}" has no usable address: ${broken}`);
  if (symbols.instances.has(key)) {
    const type = symbols.instances.get(key)!;
    const out = BLOCK_SPECS[type].powerOut;
    return fail(`"${source}" is a ${type} block; name one of its outputs, e.g. ${source}.${out}`);
  }
  const suggestion = suggestTag(source, symbols);
  const hint = suggestion !== null ? ` (did you mean "${suggestion}"?)` : '';
  return fail(`unknown tag "${source}"${hint} — add it to the tag table or use an address such as %IX2`);
}

/** The canonical text of a resolved operand, e.g. for comparing two spellings. */
export function operandKey(operand: Operand): string {
  switch (operand.kind) {
    case 'bit':
      return formatAddress(operand.address);
    case 'member':
      return `${operand.instance}.${operand.member}`;
    case 'time':
      return `TIME:${operand.ms}`;
    case 'int':
      return `INT:${operand.value}`;
    case 'bool':
      return operand.value ? 'TRUE' : 'FALSE';
  }
}
