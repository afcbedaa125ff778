/**
 * Loading a program document: the one function that turns untrusted JSON into a `Program`
 * (client and server alike). It applies the schema's defaults, refuses what the schema refuses
 * with a message naming the place (`rungs[2].network.items[0]: unknown element kind "lamp"`) and
 * checks that ids are unique. It does not rearrange networks: what was saved is what loads.
 */
import { checkDocumentBounds } from './bounds';
import { ID_PREFIX, freshId } from './ids';
import { isParsedProgram } from './wellFormed';
import { fail, ok, type Result } from './result';
import {
  BlockSchema,
  CoilSchema,
  ContactSchema,
  ParallelSchema,
  PROGRAM_FORMAT,
  PROGRAM_VERSION,
  ProgramSchema,
  SeriesSchema,
  type NetworkNode,
  type Program,
} from './schema';
import type { z } from 'zod';

export { freshId };

/** Schemas of network nodes by kind, to explain a node that matches none of them. */
const NODE_SCHEMAS = {
  contact: ContactSchema,
  coil: CoilSchema,
  block: BlockSchema,
  series: SeriesSchema,
  parallel: ParallelSchema,
} as const satisfies Record<NetworkNode['kind'], z.ZodType>;

const MAX_REPORTED = 5;

type PathKey = PropertyKey;

/** Paths longer than this are shown with their middle left out (a deep branch is 60 keys long). */
const LONGEST_SHOWN_PATH = 12;

/**
 * `rungs[2].network.items[0]`; the empty path is "the document". A path longer than
 * `LONGEST_SHOWN_PATH` keys keeps its start and end around an ellipsis.
 */
export function formatIssuePath(path: readonly PathKey[]): string {
  if (path.length > LONGEST_SHOWN_PATH) {
    return `${formatIssuePath(path.slice(0, 7))}…${formatIssuePath(path.slice(-4))}`;
  }
  let text = '';
  for (const key of path) {
    if (typeof key === 'number') text += `[${key}]`;
    else text += text === '' ? String(key) : `.${String(key)}`;
  }
  return text === '' ? 'the document' : text;
}

function valueAt(root: unknown, path: readonly PathKey[]): unknown {
  let value = root;
  for (const key of path) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<PropertyKey, unknown>)[key];
  }
  return value;
}

/** One readable line per zod issue, digging into unions by the node's `kind`. */
function describeIssues(issues: readonly z.core.$ZodIssue[], root: unknown, prefix: readonly PathKey[]): string[] {
  return issues.flatMap((issue) => describeIssue(issue, root, prefix));
}

/** Whether `path` is the place of a network node: an item of a series or a branch of a parallel. */
function isNodePlace(path: readonly PathKey[]): boolean {
  return path.length >= 2 && typeof path.at(-1) === 'number' && (path.at(-2) === 'items' || path.at(-2) === 'branches');
}

/** What is wrong with the network node at `path` whose `kind` names no kind of node. */
function describeNode(root: unknown, path: readonly PathKey[]): string {
  const where = formatIssuePath(path);
  const value = valueAt(root, path);
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    return `${where}: expected a network node (an object with a "kind"), got ${describeValue(value)}`;
  }
  const kind = (value as { kind?: unknown }).kind;
  if (typeof kind !== 'string') return `${where}: a network node needs a "kind" (contact, coil, block, series or parallel)`;
  return `${where}: unknown element kind "${kind}" (expected contact, coil, block, series or parallel)`;
}

function describeIssue(issue: z.core.$ZodIssue, root: unknown, prefix: readonly PathKey[]): string[] {
  const path = [...prefix, ...issue.path];
  const where = formatIssuePath(path);
  // A network node is chosen by its `kind` (a discriminated union): a node whose kind names no
  // kind of node is reported at the node's `kind`; one that is not an object, as a wrong type.
  if (issue.code === 'invalid_union' && path.at(-1) === 'kind' && isNodePlace(path.slice(0, -1))) return [describeNode(root, path.slice(0, -1))];
  if (issue.code === 'invalid_type' && issue.expected === 'object' && isNodePlace(path)) return [describeNode(root, path)];
  if (issue.code === 'invalid_union') {
    // Any other union (none today): explain the node by the schema of its kind where it has one.
    const value = valueAt(root, path);
    const kind = value !== null && typeof value === 'object' ? (value as { kind?: unknown }).kind : undefined;
    if (typeof kind !== 'string' || !(kind in NODE_SCHEMAS)) return [describeNode(root, path)];
    const parsed = NODE_SCHEMAS[kind as keyof typeof NODE_SCHEMAS].safeParse(value);
    if (!parsed.success) return describeIssues(parsed.error.issues, root, path);
    return [`${where}: ${issue.message}`];
  }
  if (path.length === 1 && path[0] === 'format') {
    return [`format: not a Rungwright program (expected "${PROGRAM_FORMAT}")`];
  }
  if (path.length === 1 && path[0] === 'version') {
    const found = valueAt(root, path);
    return [`version: this document is version ${describeValue(found)}; Rungwright reads version ${PROGRAM_VERSION}`];
  }
  if (issue.code === 'invalid_value' && path.at(-1) === 'variant') {
    return [`${where}: unknown variant ${describeValue(valueAt(root, path))} (expected ${issue.values.join(', ')})`];
  }
  if (issue.code === 'invalid_value' && path.at(-1) === 'type') {
    return [`${where}: unknown block type ${describeValue(valueAt(root, path))} (expected ${issue.values.join(', ')})`];
  }
  if (issue.code === 'invalid_type' && valueAt(root, path) === undefined) {
    return [`${where}: missing (expected ${issue.expected})`];
  }
  return [`${where}: ${issue.message}`];
}

function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}…` : value);
  if (typeof value === 'object') return 'an object';
  return String(value);
}

function joinProblems(problems: readonly string[]): string {
  const unique = [...new Set(problems)];
  const shown = unique.slice(0, MAX_REPORTED).join('; ');
  const more = unique.length - MAX_REPORTED;
  return more > 0 ? `${shown} (and ${more} more)` : shown;
}

/** Every id in document order, each with where it is (built only to explain a duplicate). */
function locatedIds(program: Program): Array<[string, string]> {
  const found: Array<[string, string]> = [];
  const walk = (node: NetworkNode, where: string): void => {
    found.push([node.id, where]);
    if (node.kind === 'series') node.items.forEach((child, i) => walk(child, `${where}.items[${i}]`));
    if (node.kind === 'parallel') node.branches.forEach((child, i) => walk(child, `${where}.branches[${i}]`));
  };
  program.rungs.forEach((rung, index) => {
    found.push([rung.id, `rungs[${index}]`]);
    walk(rung.network, `rungs[${index}].network`);
  });
  return found;
}

/**
 * The first repeated id, with where both uses are (`rungs[1].network.items[0]`), or null. Places
 * are spelled out only once a repeat is found: a long program has tens of thousands of nodes, and
 * a string per node made this the slowest part of loading, saving and compiling it.
 */
function findDuplicateId(program: Program): string | null {
  const seen = new Set<string>();
  let repeated = false;
  const visit = (node: NetworkNode): void => {
    if (seen.has(node.id)) repeated = true;
    seen.add(node.id);
    const children = node.kind === 'series' ? node.items : node.kind === 'parallel' ? node.branches : [];
    for (let i = 0; i < children.length && !repeated; i += 1) visit(children[i]!);
  };
  for (const rung of program.rungs) {
    if (seen.has(rung.id)) repeated = true;
    seen.add(rung.id);
    if (!repeated) visit(rung.network);
    if (repeated) break;
  }
  if (!repeated) return null;
  const first = new Map<string, string>();
  for (const [id, where] of locatedIds(program)) {
    const earlier = first.get(id);
    if (earlier !== undefined) return `${where}: duplicate id "${id}" (first used at ${earlier})`;
    first.set(id, where);
  }
  return null;
}

/**
 * Parse and normalise a program document from JSON data (not text: `JSON.parse` first). A
 * document the schema would take as it is comes back as the same object (`isParsedProgram`, one
 * walk: the zod schema cost a 200-rung document 27-41 ms on the workbench's first load and a
 * 20-rung save a tenth of a millisecond); any other goes through the schema, for its defaults and
 * its located messages.
 */
export function parseProgram(json: unknown): Result<Program> {
  if (isParsedProgram(json)) return ok(json);
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    return fail(`the document is not a Rungwright program: expected a JSON object, got ${describeValue(json)}`);
  }
  // Before the schema, which recurses once per nesting level: a document nested past the limit
  // would overflow the call stack there instead of being refused.
  const outOfBounds = checkDocumentBounds(json);
  if (outOfBounds) return fail(`${formatIssuePath(outOfBounds.path)}: ${outOfBounds.message}`);
  const parsed = ProgramSchema.safeParse(json);
  if (!parsed.success) return fail(joinProblems(describeIssues(parsed.error.issues, json, [])));
  const duplicate = findDuplicateId(parsed.data);
  if (duplicate !== null) return fail(duplicate);
  return ok(parsed.data);
}

/** Parse a document from its JSON text, with a clear message when the text is not JSON. */
export function parseProgramText(text: string): Result<Program> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return fail(`the file is not valid JSON: ${error instanceof Error ? error.message : String(error)}`);
  }
  return parseProgram(json);
}

/** A new program with one empty rung, ready for the editor. */
export function createEmptyProgram(title?: string): Program {
  const cleanTitle = title?.trim();
  return {
    format: PROGRAM_FORMAT,
    version: PROGRAM_VERSION,
    title: cleanTitle ? cleanTitle.slice(0, 200) : 'Untitled program',
    description: '',
    tags: [],
    rungs: [{ id: `${ID_PREFIX.rung}1`, comment: '', network: { kind: 'series', id: `${ID_PREFIX.series}1`, items: [] } }],
  };
}
