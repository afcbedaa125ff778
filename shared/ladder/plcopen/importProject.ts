/**
 * PLCopen TC6 XML 2.01 → a Rungwright program. The file is checked before it is parsed (size,
 * DOCTYPE and entities, well-formedness), then read element by element; rungs come from the
 * connection graph (`topology.ts`), never from positions, which only order rungs and branches.
 * Every refusal is a message naming the element and its `localId`; what is kept with a change
 * (a name given a memory bit, a comment shortened) is a warning.
 */
import { createIdSource, ID_PREFIX, type IdSource } from '../ids';
import { fail, ok, type Result } from '../result';
import { parseProgram } from '../restore';
import { IdSchema, PROGRAM_FORMAT, PROGRAM_VERSION, type Element, type NetworkNode, type Program, type Rung, type Series } from '../schema';
import { TC6_NAMESPACE } from './constants';
import { DEFAULT_MAX_IMPORT_BYTES, checkXmlInput } from './guard';
import { readLdBody, type BlockRecord, type BodyRecord, type CommentRecord, type InVariableRecord, type PowerElement } from './readBody';
import { recoverRungs, type RecoveredRung, type Tree } from './topology';
import { clip, createOperandResolver, readDeclarations, type OperandResolver } from './variables';
import { MAX_XML_DEPTH, child, childrenNamed, elementChildren, localName, parseXmlRoots, textContent, type XmlElement } from './xmlTree';

/** Options of `importPlcopen`. */
export interface ImportPlcopenOptions {
  /** Refuse larger input, in bytes of UTF-8. Default 1 MB (1,048,576). */
  maxBytes?: number;
}

/** What an import gives: the program, and what was changed on the way in. */
export interface ImportedProgram {
  program: Program;
  warnings: string[];
}

const BODY_LANGUAGES: Record<string, string> = { IL: 'an IL', ST: 'an ST', FBD: 'an FBD', SFC: 'an SFC', LD: 'an LD' };

/**
 * Read a PLCopen TC6 XML 2.01 project with an LD body. Never throws for bad input: every problem is
 * `{ ok: false, error }` with a message that says what and where.
 */
export function importPlcopen(xml: string, options: ImportPlcopenOptions = {}): Result<ImportedProgram> {
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_IMPORT_BYTES;
  if (!Number.isFinite(maxBytes) || maxBytes <= 0) return fail(`maxBytes must be a positive number of bytes, got ${String(maxBytes)}`);
  const checked = checkXmlInput(xml, maxBytes);
  if (!checked.ok) return checked;
  let roots: XmlElement[];
  try {
    roots = parseXmlRoots(xml);
  } catch (error) {
    // The validator passed it, so this is the parser's own limit (nesting) or a stack overflow.
    const message = error instanceof Error ? error.message : String(error);
    const tooDeep = error instanceof RangeError || /nested/i.test(message);
    const reason = tooDeep ? `its elements nest more than ${MAX_XML_DEPTH} levels deep` : `the XML parser stopped: ${message}`;
    return fail(`the file could not be read: ${reason}`);
  }
  if (roots.length !== 1) return fail(`the file is not well-formed XML: it has ${roots.length} root elements, XML allows exactly one`);
  return readProject(roots[0] as XmlElement);
}

function readProject(project: XmlElement): Result<ImportedProgram> {
  if (localName(project) !== 'project') {
    return fail(`the root element is <${project.name}>, not a PLCopen <project>: this is not a PLCopen TC6 XML file`);
  }
  const namespace = namespaceOf(project);
  if (namespace !== TC6_NAMESPACE) {
    const found = namespace === undefined ? 'no namespace' : `namespace "${namespace}"`;
    return fail(`the project has ${found}; Rungwright reads PLCopen TC6 XML 2.01 (namespace "${TC6_NAMESPACE}")`);
  }
  const warnings: string[] = [];
  const chosen = choosePou(project, warnings);
  if (!chosen.ok) return chosen;
  const { pou, ld } = chosen.value;

  const records = readLdBody(ld);
  if (!records.ok) return records;
  const rungs = recoverRungs(records.value);
  if (!rungs.ok) return rungs;

  const blockInputs = readBlockOperands(records.value, warnings);
  if (!blockInputs.ok) return blockInputs;
  const operandTexts = records.value.flatMap((r) =>
    r.kind === 'contact' || r.kind === 'coil' ? [r.operand] : r.kind === 'inVariable' ? [r.expression] : [],
  );
  const instances = new Set(records.value.flatMap((r) => (r.kind === 'block' && r.instance !== '' ? [r.instance] : [])));
  const resolver = createOperandResolver(readDeclarations(pou, project), operandTexts, instances);
  if (!resolver.ok) return resolver;

  const built = buildRungs(rungs.value, records.value, blockInputs.value, resolver.value, warnings);
  const withComments = attachComments(built, records.value.filter((r): r is CommentRecord => r.kind === 'comment'), warnings);

  const header = child(project, 'contentHeader');
  const title = header?.attrs.name ?? pou.attrs.name ?? 'Imported program';
  const comment = header === undefined ? undefined : child(header, 'Comment');
  const description = comment === undefined ? '' : textContent(comment);
  const document = {
    format: PROGRAM_FORMAT,
    version: PROGRAM_VERSION,
    title: clip(title, 200, 'the title', warnings),
    description: clip(description, 10_000, 'the description', warnings),
    tags: resolver.value.tags(),
    rungs: withComments,
  };
  const program = parseProgram(document);
  if (!program.ok) return fail(`the file was read, but the program it gives is not valid: ${program.error}`);
  return ok({ program: program.value, warnings: [...warnings, ...resolver.value.warnings()] });
}

/** `xmlns` (or `xmlns:p` for a `p:project`) of the root element. */
function namespaceOf(element: XmlElement): string | undefined {
  const colon = element.name.indexOf(':');
  const attribute = colon < 0 ? 'xmlns' : `xmlns:${element.name.slice(0, colon)}`;
  return element.attrs[attribute]?.trim();
}

/** The first program POU with an LD body; other POUs are left out with a warning. */
function choosePou(project: XmlElement, warnings: string[]): Result<{ pou: XmlElement; ld: XmlElement }> {
  const pous = childrenNamed(child(child(project, 'types') ?? project, 'pous') ?? project, 'pou');
  if (pous.length === 0) return fail('the project has no POU (types/pous/pou): there is no program to read');
  const programs = pous.filter((p) => p.attrs.pouType === 'program');
  if (programs.length === 0) {
    return fail(`the project has no program POU (pouType="program"); it has ${pous.map(pouLabel).join(', ')}`);
  }
  for (const pou of programs) {
    const ld = bodyLanguages(pou).find((b) => localName(b) === 'LD');
    if (ld === undefined) continue;
    for (const other of pous) if (other !== pou) warnings.push(`${pouLabel(other)} was left out: Rungwright reads one program`);
    for (const extra of ['actions', 'transitions']) {
      if (child(pou, extra) !== undefined) warnings.push(`the ${extra} of ${pouLabel(pou)} were left out: they belong to SFC`);
    }
    return ok({ pou, ld });
  }
  const first = programs[0] as XmlElement;
  const language = bodyLanguages(first)[0];
  if (language === undefined) return fail(`${pouLabel(first)} has no body: there are no rungs to read`);
  const name = localName(language);
  return fail(`${pouLabel(first)} has ${BODY_LANGUAGES[name] ?? `a ${name}`} body; Rungwright reads only LD (ladder diagram) bodies`);
}

function pouLabel(pou: XmlElement): string {
  return `pou "${pou.attrs.name ?? ''}" (pouType ${pou.attrs.pouType ?? 'missing'})`;
}

function bodyLanguages(pou: XmlElement): XmlElement[] {
  return childrenNamed(pou, 'body').flatMap((body) => elementChildren(body).filter((e) => localName(e) in BODY_LANGUAGES));
}

/** Block inputs other than the power flow: each fed by one `inVariable`, whose expression is the operand. */
function readBlockOperands(records: readonly BodyRecord[], warnings: string[]): Result<Map<number, Array<{ param: string; text: string }>>> {
  const byId = new Map(records.map((r) => [r.localId, r] as const));
  const used = new Set<number>();
  const operands = new Map<number, Array<{ param: string; text: string }>>();
  for (const block of records.filter((r): r is BlockRecord => r.kind === 'block')) {
    const list: Array<{ param: string; text: string }> = [];
    for (const { param, wires } of block.operandInputs) {
      if (wires.length === 0) continue;
      if (wires.length > 1) return fail(`input ${param} of ${block.label} has ${wires.length} connections; an operand input takes one`);
      const wire = wires[0] as { refLocalId: number };
      const source = byId.get(wire.refLocalId);
      if (source === undefined) return fail(`input ${param} of ${block.label} is connected to localId ${wire.refLocalId}, which is not in the LD body`);
      if (source.kind !== 'inVariable') {
        return fail(
          `input ${param} of ${block.label} is wired from ${source.label}; Rungwright gives a block's inputs other than its power flow as operands (an address, a tag or a constant) in an inVariable`,
        );
      }
      used.add(source.localId);
      list.push({ param, text: source.expression });
    }
    operands.set(block.localId, list);
  }
  for (const variable of records.filter((r): r is InVariableRecord => r.kind === 'inVariable')) {
    if (!used.has(variable.localId)) warnings.push(`${variable.label} feeds no block input; it was left out`);
  }
  return ok(operands);
}

/**
 * Hands out `prefix + n` ids unused in `source`. Remembers where each prefix got to, so a file of
 * thousands of rungs does not search from 1 every time (ids the file keeps are claimed first).
 */
function createFreshIds(source: IdSource): (prefix: string) => string {
  const last = new Map<string, number>();
  return (prefix) => {
    let n = last.get(prefix) ?? 0;
    let id: string;
    do {
      n += 1;
      id = `${prefix}${n}`;
    } while (!source.claim(id));
    last.set(prefix, n);
    return id;
  };
}

/** Rungs with ids: the file's own (from our `addData`) where valid and unique, fresh ones otherwise. */
function buildRungs(
  recovered: readonly RecoveredRung[],
  records: readonly BodyRecord[],
  blockOperands: ReadonlyMap<number, Array<{ param: string; text: string }>>,
  resolver: OperandResolver,
  warnings: string[],
): Array<Rung & { y: number }> {
  const source = createIdSource([]);
  const fresh = createFreshIds(source);
  const claim = (candidate: string | undefined): string | undefined =>
    candidate !== undefined && IdSchema.safeParse(candidate).success && source.claim(candidate) ? candidate : undefined;

  const written = new Map<number, string>();
  for (const record of records) {
    if (record.kind === 'leftRail') for (const [localId, id] of record.elementIds) written.set(localId, id);
  }
  const rungIds = recovered.map((rung) => claim(rung.rails.map((r) => r.rungId).find((id) => id !== undefined)));
  const elementIds = new Map<number, string | undefined>();
  for (const rung of recovered) for (const member of rung.members) elementIds.set(member.localId, claim(written.get(member.localId)));

  const toElement = (record: PowerElement): Element => {
    const id = elementIds.get(record.localId) ?? fresh(ID_PREFIX[record.kind]);
    const comment = record.comment === undefined ? {} : { comment: clip(record.comment, 500, `the documentation of ${record.label}`, warnings) };
    if (record.kind === 'block') {
      const inputs: Record<string, string> = {};
      for (const { param, text } of blockOperands.get(record.localId) ?? []) {
        inputs[param] = resolver.input(text, `input ${param} of ${record.label}`);
      }
      return { kind: 'block', id, type: record.type, instance: record.instance, inputs, ...comment };
    }
    const operand = resolver.bit(record.operand, record.label);
    return { kind: record.kind, id, variant: record.variant, operand, ...comment } as Element;
  };
  const toNode = (tree: Tree): NetworkNode => {
    if (tree.kind === 'element') return toElement(tree.element);
    if (tree.kind === 'wire') return { kind: 'series', id: fresh(ID_PREFIX.series), items: [] };
    if (tree.kind === 'series') return { kind: 'series', id: fresh(ID_PREFIX.series), items: tree.items.map(toNode) };
    return { kind: 'parallel', id: fresh(ID_PREFIX.parallel), branches: tree.branches.map(toNode) };
  };
  /** A rung's network is always a series at the root. */
  const rootSeries = (tree: Tree): Series => {
    const id = fresh(ID_PREFIX.series);
    if (tree.kind === 'wire') return { kind: 'series', id, items: [] };
    if (tree.kind === 'series') return { kind: 'series', id, items: tree.items.map(toNode) };
    return { kind: 'series', id, items: [toNode(tree)] };
  };
  return recovered.map((rung, index) => {
    const id = rungIds[index] ?? fresh(ID_PREFIX.rung);
    return { id, comment: '', network: rootSeries(rung.network), y: rung.y };
  });
}

/**
 * Comments have no connections, so position is all there is: a comment our exporter wrote names
 * its rung in `addData`; any other belongs to the first rung at or below it (else the last rung).
 */
function attachComments(rungs: Array<Rung & { y: number }>, comments: readonly CommentRecord[], warnings: string[]): Rung[] {
  const texts = new Map<number, string[]>();
  const sorted = [...comments].sort((a, b) => a.y - b.y || a.localId - b.localId);
  for (const comment of sorted) {
    if (comment.text === '') continue;
    let index = comment.rungId === undefined ? -1 : rungs.findIndex((r) => r.id === comment.rungId);
    if (index < 0) index = rungs.findIndex((r) => r.y >= comment.y);
    if (index < 0) index = rungs.length - 1;
    if (index < 0) {
      warnings.push(`${comment.label} belongs to no rung (the body has none); it was left out`);
      continue;
    }
    texts.set(index, [...(texts.get(index) ?? []), comment.text]);
  }
  return rungs.map(({ y: _y, ...rung }, index) => {
    const text = (texts.get(index) ?? []).join('\n');
    return { ...rung, comment: clip(text, 2000, `the comment of rung ${index + 1}`, warnings) };
  });
}
