/**
 * Edits of the program as a whole: rungs, tags, title and description. Same contract as every
 * edit: pure, and the same document back when nothing changes or the arguments do not fit.
 */
import { formatAddress, parseAddress } from './addresses';
import { idsOf, mapOperands, updateRung, withFreshIds, withUniqueIds } from './editCore';
import { ID_PREFIX } from './ids';
import { symbolKey } from './operands';
import { ProgramSchema, RungSchema, TagSchema, type Program, type Rung, type Series, type Tag } from './schema';

const MAX_RUNGS = 5000;
const MAX_TAGS = 500;

function rungIndex(doc: Program, rungId: string): number {
  return doc.rungs.findIndex((r) => r.id === rungId);
}

/**
 * Add a rung after `afterRungId` (at the top when it is `null`, at the end when it is left out).
 * Without `rung`, an empty one; a given rung keeps its ids where they are free.
 */
export function addRung(doc: Program, args: { afterRungId?: string | null; rung?: unknown } = {}): Program {
  if (doc.rungs.length >= MAX_RUNGS) return doc;
  let at = doc.rungs.length;
  if (args.afterRungId === null) at = 0;
  else if (args.afterRungId !== undefined) {
    const index = rungIndex(doc, args.afterRungId);
    if (index < 0) return doc;
    at = index + 1;
  }
  const ids = idsOf(doc);
  let rung: Rung;
  if (args.rung === undefined) {
    rung = { id: ids.next(ID_PREFIX.rung), comment: '', network: { kind: 'series', id: ids.next(ID_PREFIX.series), items: [] } };
  } else {
    const parsed = RungSchema.safeParse(args.rung);
    if (!parsed.success) return doc;
    const id = ids.claim(parsed.data.id) ? parsed.data.id : ids.next(ID_PREFIX.rung);
    rung = { ...parsed.data, id, network: withUniqueIds(parsed.data.network, ids) as Series };
  }
  const rungs = doc.rungs.slice();
  rungs.splice(at, 0, rung);
  return { ...doc, rungs };
}

/** Move a rung up (`-1`) or down (`1`). */
export function moveRung(doc: Program, args: { rungId: string; offset: -1 | 1 }): Program {
  const index = rungIndex(doc, args.rungId);
  const target = index + args.offset;
  if (index < 0 || (args.offset !== -1 && args.offset !== 1) || target < 0 || target >= doc.rungs.length) return doc;
  const rungs = doc.rungs.slice();
  [rungs[index], rungs[target]] = [rungs[target]!, rungs[index]!];
  return { ...doc, rungs };
}

/** Copy a rung, with fresh ids for it and every node, right below the original. */
export function duplicateRung(doc: Program, args: { rungId: string }): Program {
  const index = rungIndex(doc, args.rungId);
  if (index < 0 || doc.rungs.length >= MAX_RUNGS) return doc;
  const original = doc.rungs[index]!;
  const ids = idsOf(doc);
  const copy: Rung = { ...original, id: ids.next(ID_PREFIX.rung), network: withFreshIds(original.network, ids) };
  const rungs = doc.rungs.slice();
  rungs.splice(index + 1, 0, copy);
  return { ...doc, rungs };
}

/** Remove a rung. */
export function deleteRung(doc: Program, args: { rungId: string }): Program {
  const index = rungIndex(doc, args.rungId);
  if (index < 0) return doc;
  return { ...doc, rungs: doc.rungs.filter((_, i) => i !== index) };
}

/** Set a rung's comment (trimmed). */
export function setRungComment(doc: Program, args: { rungId: string; comment: string }): Program {
  const comment = args.comment.trim();
  if (comment.length > 2000) return doc;
  return updateRung(doc, args.rungId, (rung) => (rung.comment === comment ? rung : { ...rung, comment }));
}

function tagIndex(doc: Program, name: string): number {
  const key = symbolKey(name);
  return doc.tags.findIndex((t) => symbolKey(t.name) === key);
}

/** Add a tag (at `index`, else at the end); refused when the name is taken (names ignore case) or invalid. */
export function addTag(doc: Program, args: { tag: unknown; index?: number }): Program {
  const parsed = TagSchema.safeParse(args.tag);
  if (!parsed.success || doc.tags.length >= MAX_TAGS) return doc;
  const tag: Tag = { ...parsed.data, address: parsed.data.address.trim() };
  if (tagIndex(doc, tag.name) >= 0) return doc;
  const tags = doc.tags.slice();
  const at = args.index === undefined ? tags.length : Math.max(0, Math.min(tags.length, Math.trunc(args.index)));
  tags.splice(at, 0, tag);
  return { ...doc, tags };
}

/** Change a tag's address and/or comment. */
export function updateTag(doc: Program, args: { name: string; address?: string; comment?: string; retain?: boolean }): Program {
  const index = tagIndex(doc, args.name);
  if (index < 0) return doc;
  const current = doc.tags[index]!;
  const { retain: _retain, ...rest } = current;
  const retain = args.retain ?? current.retain === true;
  // Not retained is written by leaving the flag out, so documents without retain stay as they were.
  const next: Tag = { ...rest, address: args.address?.trim() ?? current.address, comment: args.comment?.trim() ?? current.comment, ...(retain && { retain: true }) };
  if (next.address === current.address && next.comment === current.comment && retain === (current.retain === true)) return doc;
  if (!TagSchema.safeParse(next).success) return doc;
  const tags = doc.tags.slice();
  tags[index] = next;
  return { ...doc, tags };
}

/** Rename a tag; every operand that used the old name (in any case) now uses the new one. */
export function renameTag(doc: Program, args: { from: string; to: string }): Program {
  const index = tagIndex(doc, args.from);
  const to = args.to.trim();
  if (index < 0) return doc;
  const current = doc.tags[index]!;
  if (current.name === to || !TagSchema.shape.name.safeParse(to).success) return doc;
  const clash = tagIndex(doc, to);
  if (clash >= 0 && clash !== index) return doc;
  const tags = doc.tags.slice();
  tags[index] = { ...current, name: to };
  const oldKey = symbolKey(current.name);
  const renamed = mapOperands(doc, (text) => (symbolKey(text) === oldKey ? to : text));
  return { ...renamed, tags };
}

/**
 * Remove a tag. Operands that used it now name its address directly, so the program keeps its
 * meaning; when the address does not parse they are left as they were.
 */
export function deleteTag(doc: Program, args: { name: string }): Program {
  const index = tagIndex(doc, args.name);
  if (index < 0) return doc;
  const tag = doc.tags[index]!;
  const tags = doc.tags.filter((_, i) => i !== index);
  const address = parseAddress(tag.address);
  const key = symbolKey(tag.name);
  const rewritten = address.ok ? mapOperands(doc, (text) => (symbolKey(text) === key ? formatAddress(address.value) : text)) : doc;
  return { ...rewritten, tags };
}

/** Set the program's title (trimmed; empty gives the default title). */
export function setTitle(doc: Program, args: { title: string }): Program {
  const title = args.title.trim() || 'Untitled program';
  if (title === doc.title || !ProgramSchema.shape.title.safeParse(title).success) return doc;
  return { ...doc, title };
}

/** Set the program's description (Markdown source, kept as typed apart from trailing space). */
export function setDescription(doc: Program, args: { description: string }): Program {
  const description = args.description.trimEnd();
  if (description === doc.description || !ProgramSchema.shape.description.safeParse(description).success) return doc;
  return { ...doc, description };
}
