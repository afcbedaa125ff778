/**
 * A fast, exact test that a value is already a parsed program: true only when `parseProgram`
 * would accept it and return it unchanged (every field the schema defaults present, no key the
 * schema strips, every limit and pattern of `shared/ladder/schema.ts` kept, ids unique).
 *
 * Why: every program reaching `compile` has been through `parseProgram` where it entered (load,
 * save, import) or is a pure edit of one, yet `compile` must not trust that; running the whole
 * zod schema again cost more than the rest of compiling (30 ms of 1,000 rungs on this machine).
 * This one walk, which also checks the size limits (`checkDocumentBounds`, whose generic walk
 * alone cost 10 ms there), costs about a millisecond. It may refuse a document the schema would take (then the
 * schema runs, with its located messages); it must never accept one the schema would refuse or
 * change, which the tests check against the schema on generated and mutated documents.
 */
import { BlockTypeSchema, CoilVariantSchema, ContactVariantSchema, DOCUMENT_LIMITS as BOUNDS, PROGRAM_FORMAT, PROGRAM_VERSION, type Program } from './schema';
import { IdSet } from './idSet';

const TAG_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;
const CONTACT_VARIANTS: ReadonlySet<unknown> = new Set(ContactVariantSchema.options);
const COIL_VARIANTS: ReadonlySet<unknown> = new Set(CoilVariantSchema.options);
const BLOCK_TYPES: ReadonlySet<unknown> = new Set(BlockTypeSchema.options);

/** The schema's field limits (`shared/ladder/schema.ts`); the tests hold them to it. The size limits are `DOCUMENT_LIMITS` there. */
export const SCHEMA_LIMITS = {
  id: 64,
  operand: 64,
  elementComment: 500,
  instance: 32,
  seriesItems: 200,
  parallelBranches: 64,
  rungComment: 2000,
  tagName: 32,
  tagAddress: 16,
  tagComment: 200,
  tags: 500,
  title: 200,
  description: 10_000,
  rungs: 5000,
} as const;

const L = SCHEMA_LIMITS;

type Plain = Record<string, unknown>;

/** A plain object (as JSON gives) whose own keys are all in `allowed`. */
function isRecord(value: unknown): value is Plain {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value) as unknown;
  return proto === Object.prototype || proto === null;
}

/**
 * `hasOwnProperty` called on the key a for-in loop gives is turned into a check of the object's
 * shape by V8's optimising compiler; `Object.hasOwn` there cost three times as much (0.4 ms of
 * 18,000 nodes).
 */
const hasOwn = Object.prototype.hasOwnProperty;

function keysWithin(value: Plain, required: number, optional: string | null): boolean {
  let count = 0;
  for (const key in value) {
    if (!hasOwn.call(value, key)) return false;
    count += 1;
  }
  return count === required || (optional !== null && count === required + 1 && Object.hasOwn(value, optional));
}

/** A string of at most `max` characters without NUL (which `checkDocumentBounds` refuses everywhere). */
const text = (value: unknown, max: number): boolean => typeof value === 'string' && value.length <= max && (value.length === 0 || value.indexOf('\u0000') < 0);
const comment = (node: Plain): boolean => node.comment === undefined ? !Object.hasOwn(node, 'comment') : text(node.comment, L.elementComment);

function isInputs(value: unknown): boolean {
  if (!isRecord(value)) return false;
  for (const key in value) if (!hasOwn.call(value, key) || key.indexOf('\u0000') >= 0 || !text(value[key], L.operand)) return false;
  return true;
}

/**
 * The walk's running state: ids seen, and the node counts `DOCUMENT_LIMITS` bounds (counted here
 * as `checkDocumentBounds` counts them, so the schema's bounds pass need not walk again).
 */
interface Walk {
  /** Ids seen; adding one also checks its spelling (the id pattern admits no NUL). */
  readonly ids: IdSet;
  /** Nodes in the rung being walked, and in the rungs before it. */
  rungNodes: number;
  programNodes: number;
}

/** A network node at nesting `depth` (series and parallel above it, the root series 1); false on a repeated id or a limit passed. */
function isNode(value: unknown, depth: number, walk: Walk): boolean {
  if (!isRecord(value) || !walk.ids.addNew(value.id)) return false;
  walk.rungNodes += 1;
  walk.programNodes += 1;
  if (walk.rungNodes > BOUNDS.nodesPerRung || walk.programNodes > BOUNDS.nodesPerProgram) return false;
  switch (value.kind) {
    case 'contact':
      return keysWithin(value, 4, 'comment') && CONTACT_VARIANTS.has(value.variant) && text(value.operand, L.operand) && comment(value);
    case 'coil':
      return keysWithin(value, 4, 'comment') && COIL_VARIANTS.has(value.variant) && text(value.operand, L.operand) && comment(value);
    case 'block':
      return keysWithin(value, 5, 'comment') && BLOCK_TYPES.has(value.type) && text(value.instance, L.instance) && isInputs(value.inputs) && comment(value);
    case 'series':
      return keysWithin(value, 3, null) && depth + 1 <= BOUNDS.depth && isChildren(value.items, L.seriesItems, depth + 1, walk);
    case 'parallel':
      return keysWithin(value, 3, null) && depth + 1 <= BOUNDS.depth && isChildren(value.branches, L.parallelBranches, depth + 1, walk);
    default:
      return false;
  }
}

function isChildren(value: unknown, max: number, depth: number, walk: Walk): boolean {
  if (!Array.isArray(value) || value.length > max) return false;
  for (let i = 0; i < value.length; i += 1) if (!isNode(value[i], depth, walk)) return false;
  return true;
}

function isTag(value: unknown): boolean {
  return (
    isRecord(value) &&
    keysWithin(value, 3, null) &&
    typeof value.name === 'string' &&
    value.name.length >= 1 &&
    value.name.length <= L.tagName &&
    TAG_NAME.test(value.name) &&
    text(value.address, L.tagAddress) &&
    text(value.comment, L.tagComment)
  );
}

/** True only when `parseProgram(value)` would accept `value` and return an equal program. */
export function isParsedProgram(value: unknown): value is Program {
  if (!isRecord(value) || !keysWithin(value, 6, null)) return false;
  if (value.format !== PROGRAM_FORMAT || value.version !== PROGRAM_VERSION) return false;
  if (!text(value.title, L.title) || !text(value.description, L.description)) return false;
  const { tags, rungs } = value;
  if (!Array.isArray(tags) || tags.length > L.tags || !tags.every(isTag)) return false;
  if (!Array.isArray(rungs) || rungs.length > L.rungs) return false;
  // One walk checks the schema's fields and the size limits `parseProgram` checks first (depth,
  // nodes per rung and per program, no NUL anywhere); the depth limit also bounds its recursion.
  // Sized for 20 ids a rung (a generated 1,000-rung program has 14-19), capped by the node limit; it grows past that.
  const walk: Walk = { ids: new IdSet(L.id, Math.min(20 * rungs.length, BOUNDS.nodesPerProgram + rungs.length)), rungNodes: 0, programNodes: 0 };
  const { ids } = walk;
  for (let r = 0; r < rungs.length; r += 1) {
    const rung: unknown = rungs[r];
    if (!isRecord(rung) || !keysWithin(rung, 3, null) || !text(rung.comment, L.rungComment) || !ids.addNew(rung.id)) return false;
    walk.rungNodes = 0;
    if (!isRecord(rung.network) || rung.network.kind !== 'series' || !isNode(rung.network, 0, walk)) return false;
  }
  return true;
}
