/**
 * The size limits of a program document (`DOCUMENT_LIMITS` in `schema.ts`), checked on untrusted
 * JSON before anything recursive touches it. The zod schema recurses once per nesting level, and
 * so do layout, validation and export: a document nested a thousand levels deep overflows the call
 * stack in each of them. This walk uses its own stack, so it is safe on any depth, and stops at the
 * first node past a limit. It also refuses the NUL character (U+0000) in any string, which the
 * database cannot store in a document.
 */
import { DOCUMENT_LIMITS } from './schema';

/** Where a limit was passed: the path as keys (`['rungs', 0, 'network', 'items', 2]`) and what is wrong. */
export interface BoundsProblem {
  path: readonly (string | number)[];
  message: string;
}

interface Pending {
  value: unknown;
  /** Series and parallel nodes from the rung's root down to this node's parent. */
  depth: number;
  key: string | number;
  parent: Pending | null;
}

function pathOf(entry: Pending): (string | number)[] {
  const keys: (string | number)[] = [];
  for (let at: Pending | null = entry; at; at = at.parent) keys.push(at.key);
  return keys.reverse();
}

function childrenOf(node: Record<string, unknown>): { key: string; list: unknown[] } | null {
  if (node.kind === 'series' && Array.isArray(node.items)) return { key: 'items', list: node.items };
  if (node.kind === 'parallel' && Array.isArray(node.branches)) return { key: 'branches', list: node.branches };
  return null;
}

const isObject = (value: unknown): value is Record<string, unknown> => value !== null && typeof value === 'object' && !Array.isArray(value);

/** The first string (or object key) holding U+0000 in `root`, walked without recursion. */
function findNul(root: unknown, prefix: readonly (string | number)[]): BoundsProblem | null {
  const stack: Pending[] = [{ value: root, depth: 0, key: '', parent: null }];
  while (stack.length > 0) {
    const entry = stack.pop()!;
    const { value } = entry;
    if (typeof value === 'string') {
      if (value.includes('\u0000')) return { path: [...prefix, ...pathOf(entry).slice(1)], message: 'holds the NUL character (U+0000), which cannot be stored' };
    } else if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i -= 1) stack.push({ value: value[i], depth: 0, key: i, parent: entry });
    } else if (isObject(value)) {
      for (const [key, child] of Object.entries(value)) {
        if (key.includes('\u0000')) return { path: [...prefix, ...pathOf(entry).slice(1)], message: 'has a field name holding the NUL character (U+0000)' };
        stack.push({ value: child, depth: 0, key, parent: entry });
      }
    }
  }
  return null;
}

/** Nodes in one rung's network, or the first limit it passes (`nodesSoFar`: nodes in the rungs before). */
export function measureRung(rung: unknown, index: number, nodesSoFar = 0): { nodes: number; problem: BoundsProblem | null } {
  if (!isObject(rung)) return { nodes: 0, problem: null };
  const root: Pending = { value: rung.network, depth: 0, key: 'network', parent: { value: rung, depth: 0, key: index, parent: { value: null, depth: 0, key: 'rungs', parent: null } } };
  const stack: Pending[] = [root];
  let nodes = 0;
  while (stack.length > 0) {
    const entry = stack.pop()!;
    if (!isObject(entry.value)) continue;
    nodes += 1;
    const children = childrenOf(entry.value);
    const depth = children ? entry.depth + 1 : entry.depth;
    let message: string | null = null;
    if (depth > DOCUMENT_LIMITS.depth) message = `branches nest more than ${DOCUMENT_LIMITS.depth} levels deep in rung ${index + 1}`;
    else if (nodes > DOCUMENT_LIMITS.nodesPerRung) message = `rung ${index + 1} has more than ${DOCUMENT_LIMITS.nodesPerRung} elements and branches`;
    else if (nodesSoFar + nodes > DOCUMENT_LIMITS.nodesPerProgram) message = `the program has more than ${DOCUMENT_LIMITS.nodesPerProgram} elements and branches`;
    if (message) return { nodes, problem: { path: pathOf(entry), message } };
    if (children) {
      for (let i = children.list.length - 1; i >= 0; i -= 1) {
        stack.push({ value: children.list[i], depth, key: i, parent: { value: children.list, depth, key: children.key, parent: entry } });
      }
    }
  }
  return { nodes, problem: null };
}

/**
 * Checks `json` (a document as parsed from JSON, not yet trusted) against `DOCUMENT_LIMITS` and for
 * NUL characters; null when within bounds. Anything that is not shaped like a document is left for
 * the schema to explain.
 */
export function checkDocumentBounds(json: unknown): BoundsProblem | null {
  if (!isObject(json)) return null;
  if (Array.isArray(json.rungs)) {
    let total = 0;
    for (let r = 0; r < json.rungs.length; r += 1) {
      const measured = measureRung(json.rungs[r], r, total);
      if (measured.problem) return measured.problem;
      total += measured.nodes;
    }
  }
  return findNul(json, []);
}
