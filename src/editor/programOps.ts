/**
 * The editor's gestures on whole rungs and element fields (tags are edited with the shared
 * `shared/ladder/edits.ts` operations), as pure `(program, args) =>
 * program` functions; plus fresh ids and the factories that make new elements from the palette.
 */
import { BLOCK_SPECS, operandInputs } from '@shared/ladder/blocks';
import type { BlockType, Element, NetworkNode, Program, Rung, Series } from '@shared/ladder/schema';
import { createIdSource, ID_PREFIX } from '@shared/ladder/ids';
import { allIds, visitNodes } from '@shared/ladder/walk';
import { updateElement, updateRung } from './networkOps';
import type { PaletteItem } from './palette';

/**
 * A generator of ids unused in `program` (the shared id source: smallest free `prefix + n`).
 * Deterministic — no clock, no random — so the same gesture on the same document gives the same ids.
 */
export function idSource(program: Program): (prefix: string) => string {
  const ids = createIdSource(allIds(program));
  return (prefix) => ids.next(prefix);
}

/** The smallest `T1`, `T2`… (or `C…`, `B…`) instance name not yet used by a block of the program. */
export function freeInstanceName(program: Program, type: BlockType): string {
  const prefix = type.startsWith('T') ? 'T' : type.startsWith('C') ? 'C' : type.endsWith('TRIG') ? 'E' : 'B';
  const used = new Set<string>();
  for (const rung of program.rungs) {
    visitNodes(rung.network, (node) => {
      if (node.kind === 'block') used.add(node.instance.toUpperCase());
    });
  }
  for (let n = 1; ; n += 1) if (!used.has(`${prefix}${n}`)) return `${prefix}${n}`;
}

/** A new element for a palette item, with empty operands for the student to fill in. */
export function createElement(item: PaletteItem, id: string, program: Program): Element {
  if (item.kind === 'contact') return { kind: 'contact', id, variant: item.variant, operand: '' };
  if (item.kind === 'coil') return { kind: 'coil', id, variant: item.variant, operand: '' };
  const required: readonly string[] = BLOCK_SPECS[item.type].required;
  const inputs = Object.fromEntries(operandInputs(item.type).filter((p) => required.includes(p.name)).map((p) => [p.name, '']));
  return { kind: 'block', id, type: item.type, instance: freeInstanceName(program, item.type), inputs };
}

/** A copy of a node with every id inside it replaced by a fresh one. */
export function cloneWithFreshIds<N extends NetworkNode>(node: N, nextId: (prefix: string) => string): N {
  if (node.kind === 'series') return { ...node, id: nextId(ID_PREFIX.series), items: node.items.map((n) => cloneWithFreshIds(n, nextId)) };
  if (node.kind === 'parallel') {
    return { ...node, id: nextId(ID_PREFIX.parallel), branches: node.branches.map((n) => cloneWithFreshIds(n, nextId)) };
  }
  return { ...node, id: nextId(ID_PREFIX[node.kind]) };
}

/** A copy of a rung with fresh ids for it and everything in it. */
export function cloneRung(rung: Rung, nextId: (prefix: string) => string): Rung {
  return { ...rung, id: nextId(ID_PREFIX.rung), network: cloneWithFreshIds(rung.network, nextId) as Series };
}

/** Insert rungs at a position (0 = before the first; clamped to the end). */
export function insertRungs(program: Program, index: number, rungs: readonly Rung[]): Program {
  if (rungs.length === 0) return program;
  const at = Math.max(0, Math.min(index, program.rungs.length));
  return { ...program, rungs: [...program.rungs.slice(0, at), ...rungs, ...program.rungs.slice(at)] };
}

/** An empty rung. */
export function emptyRung(nextId: (prefix: string) => string): Rung {
  return { id: nextId(ID_PREFIX.rung), comment: '', network: { kind: 'series', id: nextId(ID_PREFIX.series), items: [] } };
}

/** Remove rungs by id. */
export function removeRungs(program: Program, ids: ReadonlySet<string>): Program {
  const rungs = program.rungs.filter((r) => !ids.has(r.id));
  return rungs.length === program.rungs.length ? program : { ...program, rungs };
}

/** Move a rung up (-1) or down (+1); same program at either end. */
export function moveRung(program: Program, id: string, step: -1 | 1): Program {
  const from = program.rungs.findIndex((r) => r.id === id);
  const to = from + step;
  if (from < 0 || to < 0 || to >= program.rungs.length) return program;
  const rungs = program.rungs.slice();
  [rungs[from], rungs[to]] = [rungs[to] as Rung, rungs[from] as Rung];
  return { ...program, rungs };
}

export function setRungComment(program: Program, id: string, comment: string): Program {
  return updateRung(program, id, (r) => (r.comment === comment ? r : { ...r, comment }));
}

/** Set a contact's or coil's operand (a block keeps its own inputs; see `setBlockInput`). */
export function setOperand(program: Program, id: string, operand: string): Program {
  return updateElement(program, id, (e) => (e.kind === 'block' || e.operand === operand ? e : { ...e, operand }));
}

/** Change a contact's or coil's variant; a variant of the other kind is ignored. */
export function setVariant(program: Program, id: string, variant: string): Program {
  return updateElement(program, id, (e) => {
    if (e.kind === 'contact' && (variant === 'no' || variant === 'nc' || variant === 'rising' || variant === 'falling'))
      return e.variant === variant ? e : { ...e, variant };
    if (e.kind === 'coil' && (variant === 'coil' || variant === 'negated' || variant === 'set' || variant === 'reset'))
      return e.variant === variant ? e : { ...e, variant };
    return e;
  });
}

export function setBlockInput(program: Program, id: string, name: string, operand: string): Program {
  return updateElement(program, id, (e) =>
    e.kind !== 'block' || e.inputs[name] === operand ? e : { ...e, inputs: { ...e.inputs, [name]: operand } },
  );
}

export function setBlockInstance(program: Program, id: string, instance: string): Program {
  return updateElement(program, id, (e) => (e.kind !== 'block' || e.instance === instance ? e : { ...e, instance }));
}

/** Set an element's comment; an empty comment removes the field. */
export function setElementComment(program: Program, id: string, comment: string): Program {
  return updateElement(program, id, (e) => {
    if ((e.comment ?? '') === comment) return e;
    if (comment === '') {
      const { comment: _dropped, ...rest } = e;
      return rest as Element;
    }
    return { ...e, comment };
  });
}

export function setTitle(program: Program, title: string): Program {
  return program.title === title ? program : { ...program, title };
}
