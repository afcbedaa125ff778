/**
 * Shared plumbing of the edit operations: find and replace a rung, admit a new element with a
 * unique id, map every operand. Every helper returns the same object when nothing changes.
 */
import { ID_PREFIX, createIdSource, type IdSource } from './ids';
import { ElementSchema, type Element, type NetworkNode, type Program, type Rung } from './schema';
import { allIds } from './walk';

/** Replace one rung through `change`; the same document when the rung is missing or unchanged. */
export function updateRung(doc: Program, rungId: string, change: (rung: Rung) => Rung): Program {
  const index = doc.rungs.findIndex((r) => r.id === rungId);
  if (index < 0) return doc;
  const rung = doc.rungs[index]!;
  const next = change(rung);
  if (next === rung) return doc;
  const rungs = doc.rungs.slice();
  rungs[index] = next;
  return { ...doc, rungs };
}

/** An id source over every id of the document. */
export function idsOf(doc: Program): IdSource {
  return createIdSource(allIds(doc));
}

/**
 * Check an element from the outside (a palette, a paste) against the schema and give it an id
 * unused in the document when its own is taken. `null` when it is not a valid element.
 */
export function admitElement(element: unknown, ids: IdSource): Element | null {
  const parsed = ElementSchema.safeParse(element);
  if (!parsed.success) return null;
  const admitted = parsed.data;
  if (ids.claim(admitted.id)) return admitted;
  return { ...admitted, id: ids.next(ID_PREFIX[admitted.kind]) };
}

/** A copy of a subtree with every id replaced by a fresh one. */
export function withFreshIds<N extends NetworkNode>(node: N, ids: IdSource): N {
  const id = ids.next(ID_PREFIX[node.kind]);
  if (node.kind === 'series') return { ...node, id, items: node.items.map((n) => withFreshIds(n, ids)) };
  if (node.kind === 'parallel') return { ...node, id, branches: node.branches.map((n) => withFreshIds(n, ids)) };
  return { ...node, id };
}

/** Keep a subtree's ids where they are free, renaming only those already taken. */
export function withUniqueIds<N extends NetworkNode>(node: N, ids: IdSource): N {
  const id = ids.claim(node.id) ? node.id : ids.next(ID_PREFIX[node.kind]);
  if (node.kind === 'series') return { ...node, id, items: node.items.map((n) => withUniqueIds(n, ids)) };
  if (node.kind === 'parallel') return { ...node, id, branches: node.branches.map((n) => withUniqueIds(n, ids)) };
  return id === node.id ? node : { ...node, id };
}

function mapNode(node: NetworkNode, change: (text: string) => string): NetworkNode {
  switch (node.kind) {
    case 'contact':
    case 'coil': {
      const operand = change(node.operand);
      return operand === node.operand ? node : { ...node, operand };
    }
    case 'block': {
      let inputs = node.inputs;
      for (const [name, text] of Object.entries(node.inputs)) {
        const next = change(text);
        if (next !== text) inputs = { ...inputs, [name]: next };
      }
      return inputs === node.inputs ? node : { ...node, inputs };
    }
    case 'series': {
      const items = node.items.map((n) => mapNode(n, change));
      return items.every((n, i) => n === node.items[i]) ? node : { ...node, items };
    }
    case 'parallel': {
      const branches = node.branches.map((n) => mapNode(n, change));
      return branches.every((n, i) => n === node.branches[i]) ? node : { ...node, branches };
    }
  }
}

/** Rewrite every operand text (contacts, coils, block inputs) of the program. */
export function mapOperands(doc: Program, change: (text: string) => string): Program {
  let changed = false;
  const rungs = doc.rungs.map((rung) => {
    const network = mapNode(rung.network, change);
    if (network === rung.network) return rung;
    changed = true;
    return { ...rung, network: network as Rung['network'] };
  });
  return changed ? { ...doc, rungs } : doc;
}
