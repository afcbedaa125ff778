/**
 * Variables of an imported file → Rungwright tags and operands. A declared variable with an
 * `address` becomes a tag; a name with no address is given a free memory bit (`%MX…`) and becomes a
 * tag, with a warning; direct addresses, block members (`T1.Q`) and constants stay as written.
 * IEC 61131-3 identifiers are case-insensitive (6.1.2 [memory for the number]), so names are
 * matched without regard to case and written as declared.
 */
import { DEFAULT_ADDRESS_SPACE, formatAddress, parseAddress } from '../addresses';
import { fail, ok, type Result } from '../result';
import { TagSchema, type Tag } from '../schema';
import { readFormattedText, readRungwrightAddData } from './formatted';
import { child, childrenNamed, elementChildren, localName, type XmlElement } from './xmlTree';

/** One `variable` declaration found in the file. */
export interface Declaration {
  name: string;
  address: string | undefined;
  /** `BOOL`, `TIME`, …, or the function block type for `<derived name="TON"/>`. */
  type: string;
  derived: boolean;
  comment: string;
  /** Declared by our exporter for a memory bit used without a tag. */
  untagged: boolean;
  initialValue: string | undefined;
  /** Declared in a list marked `retain="true"` (IEC 61131-3 RETAIN). */
  retain: boolean;
}

const VARIABLE_LISTS = ['localVars', 'tempVars', 'inputVars', 'outputVars', 'inOutVars', 'externalVars', 'globalVars', 'accessVars'];

/** Every variable the POU's interface and the configurations declare, POU first. */
export function readDeclarations(pou: XmlElement, project: XmlElement): Declaration[] {
  const lists: XmlElement[] = [];
  const pouInterface = child(pou, 'interface');
  if (pouInterface) lists.push(...elementChildren(pouInterface).filter((e) => VARIABLE_LISTS.includes(localName(e))));
  const configurations = child(child(project, 'instances') ?? project, 'configurations');
  for (const configuration of configurations ? childrenNamed(configurations, 'configuration') : []) {
    lists.push(...childrenNamed(configuration, 'globalVars'));
    for (const resource of childrenNamed(configuration, 'resource')) lists.push(...childrenNamed(resource, 'globalVars'));
  }
  return lists.flatMap((list) => childrenNamed(list, 'variable').flatMap((v) => readDeclaration(v, list.attrs.retain === 'true')));
}

function readDeclaration(variable: XmlElement, retain: boolean): Declaration[] {
  const name = variable.attrs.name?.trim();
  if (!name) return [];
  const typeElement = elementChildren(child(variable, 'type') ?? variable).find(() => true);
  const derived = typeElement !== undefined && localName(typeElement) === 'derived';
  const type = typeElement === undefined ? '' : derived ? (typeElement.attrs.name ?? '') : localName(typeElement);
  const simple = child(child(variable, 'initialValue') ?? variable, 'simpleValue');
  return [
    {
      name,
      address: variable.attrs.address?.trim(),
      type,
      derived,
      comment: readFormattedText(child(variable, 'documentation')),
      untagged: readRungwrightAddData(variable, 'untagged') !== undefined,
      initialValue: simple?.attrs.value,
      retain,
    },
  ];
}

/** Turns operand text of the file into Rungwright operands, collecting tags as it goes. */
export interface OperandResolver {
  /** The variable of a contact or coil. */
  bit(text: string, where: string): string;
  /** The expression of an `inVariable` feeding a block input. */
  input(text: string, where: string): string;
  /** Declared tags first, then the ones given a memory bit, in first-use order. */
  tags(): Tag[];
  /** Warnings so far, including the unused declarations left out. */
  warnings(): string[];
}

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
const MEMBER = /^([A-Za-z_][A-Za-z0-9_]*)\.([A-Za-z_][A-Za-z0-9_]*)$/;
const BOOLEAN_LITERAL = /^(TRUE|FALSE)$/i;

/**
 * Build a resolver. `operandTexts` is every operand the body uses (so allotted memory bits never
 * collide with a bit the file already uses); `instances` the block instance names of the body.
 */
export function createOperandResolver(
  declarations: readonly Declaration[],
  operandTexts: readonly string[],
  instances: ReadonlySet<string>,
): Result<OperandResolver> {
  const warnings: string[] = [];
  const tags: Tag[] = [];
  const byName = new Map<string, Declaration>();
  for (const declaration of declarations) {
    const key = declaration.name.toUpperCase();
    const earlier = byName.get(key);
    // An external declaration without an address may stand for a global with one: keep the one with an address.
    if (earlier === undefined || (earlier.address === undefined && declaration.address !== undefined)) byName.set(key, declaration);
  }

  const tagByName = new Map<string, Tag>();
  for (const declaration of byName.values()) {
    if (declaration.address === undefined || declaration.untagged || declaration.derived) continue;
    const comment = clip(declaration.comment, 200, `the comment of variable "${declaration.name}"`, warnings);
    const parsed = TagSchema.safeParse({ name: declaration.name, address: declaration.address, comment, ...(declaration.retain && { retain: true }) });
    if (!parsed.success) {
      const reason = parsed.error.issues[0]?.message ?? 'it is not a valid tag';
      return fail(`variable "${declaration.name}" (address ${declaration.address}) cannot become a tag: ${reason}`);
    }
    tags.push(parsed.data);
    tagByName.set(declaration.name.toUpperCase(), parsed.data);
  }
  const instanceNames = new Set([...instances].map((n) => n.toUpperCase()));
  for (const declaration of byName.values()) {
    if (declaration.derived) instanceNames.add(declaration.name.toUpperCase());
  }

  const usedMemory = new Set<number>();
  for (const text of [...operandTexts, ...declarations.map((d) => d.address ?? '')]) {
    const parsed = parseAddress(text);
    if (parsed.ok && parsed.value.area === 'M') usedMemory.add(parsed.value.index);
  }
  const used = new Set<string>();

  const allot = (name: string, where: string, declaration: Declaration | undefined): string => {
    const existing = tagByName.get(name.toUpperCase());
    if (existing) return existing.name;
    let index = 1;
    while (usedMemory.has(index)) index += 1;
    if (index > DEFAULT_ADDRESS_SPACE.memory) {
      warnings.push(`${where}: no memory bit is free for "${name}" (all ${DEFAULT_ADDRESS_SPACE.memory} are used); it is left as written`);
      return name;
    }
    usedMemory.add(index);
    const address = formatAddress({ area: 'M', index });
    const tagName = declaration?.name ?? name;
    const tag: Tag = { name: tagName, address, comment: clip(declaration?.comment ?? '', 200, `the comment of "${tagName}"`, warnings) };
    tags.push(tag);
    tagByName.set(tagName.toUpperCase(), tag);
    const why = declaration ? `variable "${tagName}" has no address` : `"${tagName}" is used but not declared`;
    warnings.push(`${why}: it becomes the tag ${tagName} on memory bit ${address}`);
    return tagName;
  };

  const resolveName = (text: string, where: string, asInput: boolean): string => {
    const trimmed = text.trim();
    if (trimmed === '' || trimmed.startsWith('%') || BOOLEAN_LITERAL.test(trimmed)) return trimmed;
    const member = MEMBER.exec(trimmed);
    if (member) {
      if (!instanceNames.has((member[1] as string).toUpperCase())) {
        warnings.push(`${where}: "${trimmed}" names no block instance of this program; it is left as written`);
      }
      return trimmed;
    }
    if (!IDENTIFIER.test(trimmed)) {
      if (!asInput) warnings.push(`${where}: "${trimmed}" is neither an address, a tag nor a block output; it is left as written`);
      return trimmed;
    }
    const key = trimmed.toUpperCase();
    used.add(key);
    const tag = tagByName.get(key);
    if (tag) return tag.name;
    const declaration = byName.get(key);
    if (declaration?.untagged && declaration.address !== undefined) return declaration.address;
    if (declaration?.derived) {
      warnings.push(`${where}: "${trimmed}" is a ${declaration.type} instance, not a bit; it is left as written`);
      return trimmed;
    }
    const isBool = declaration === undefined || declaration.type === '' || declaration.type.toUpperCase() === 'BOOL';
    if (asInput && !isBool) {
      if (declaration.initialValue !== undefined) {
        warnings.push(`${where}: "${declaration.name}" (${declaration.type}) has no address; its initial value ${declaration.initialValue} is used as the operand`);
        return declaration.initialValue;
      }
      warnings.push(`${where}: "${declaration.name}" (${declaration.type}) has neither an address nor an initial value; it is left as written`);
      return declaration.name;
    }
    return allot(trimmed, where, declaration);
  };

  return ok({
    bit: (text, where) => resolveName(text, where, false),
    input: (text, where) => resolveName(text, where, true),
    tags: () => [...tags],
    warnings: () => {
      const unused = [...byName.values()].filter(
        (d) => d.address === undefined && !d.derived && !used.has(d.name.toUpperCase()),
      );
      return [...warnings, ...unused.map((d) => `variable "${d.name}" has no address and no rung uses it; it was left out`)];
    },
  });
}

/** Shorten text to a schema limit, saying so. */
export function clip(text: string, max: number, what: string, warnings: string[]): string {
  if (text.length <= max) return text;
  warnings.push(`${what} was shortened to ${max} characters`);
  return text.slice(0, max);
}
