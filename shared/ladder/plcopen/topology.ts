/**
 * Rungs from the connection graph of an LD body, never from positions.
 *
 * IEC 61131-3 LD (8.2, links [memory for the sub-clause]) lets power flow left to right only, and
 * where links join, the state on the right is the OR of the links on the left. TC6 writes that as
 * several `connection`s on one `connectionPointIn`. So each distinct set of feeds is one junction
 * (a single feed is no junction: the element hangs straight off it); each contact, coil or block is
 * an edge from the junction of its feeds to its own output; each feed of a junction is an empty
 * wire, and a junction whose feeds include all of a smaller junction's is fed through that one.
 * A rung is a connected group of elements between the rails, and it is series-parallel exactly
 * when that two-terminal graph reduces (`seriesParallel.ts`) to one edge from rail to rail.
 */
import { BLOCK_SPECS } from '../blocks';
import { fail, ok, type Result } from '../result';
import type { BlockRecord, BodyRecord, PowerElement, RailRecord, Wire } from './readBody';
import { SINK, SOURCE, depth, ordered, reduceEdges, type Edge, type Tree } from './seriesParallel';

export type { Tree } from './seriesParallel';

/** One rung as found in the graph. */
export interface RecoveredRung {
  network: Tree;
  /** Its elements, by localId. */
  members: PowerElement[];
  /** The left rails that feed it. */
  rails: RailRecord[];
  /** Where it sits, to order rungs: the top of its highest element, then its lowest localId. */
  y: number;
  firstLocalId: number;
}

/** Branches deeper than this are refused (the document's schema nests as deep; a reader's stack does not). */
export const MAX_NESTING = 64;

/** Where a power-flow input is fed from: the left rail or another element's output. */
type Feed = { kind: 'rail'; rail: RailRecord } | { kind: 'element'; element: PowerElement };

/** Recover every rung of an LD body, ordered top to bottom. */
export function recoverRungs(records: readonly BodyRecord[]): Result<RecoveredRung[]> {
  const byId = new Map(records.map((r) => [r.localId, r] as const));
  const power = records.filter((r): r is PowerElement => r.kind === 'contact' || r.kind === 'coil' || r.kind === 'block');

  const feedsOf = new Map<number, Feed[]>();
  for (const element of power) {
    const feeds = resolveFeeds(element.inputs, element.label, byId);
    if (!feeds.ok) return feeds;
    if (feeds.value.length === 0) {
      return fail(`${element.label} has nothing connected to its input: every element of a rung must be wired from the left rail`);
    }
    feedsOf.set(element.localId, feeds.value);
  }
  const toRightRail = new Set<number>();
  const railToRail: RailRecord[] = [];
  for (const rail of records.filter((r): r is RailRecord => r.kind === 'rightRail')) {
    const feeds = resolveFeeds(rail.inputs, rail.label, byId);
    if (!feeds.ok) return feeds;
    for (const feed of feeds.value) {
      if (feed.kind === 'element') toRightRail.add(feed.element.localId);
      else if (!railToRail.includes(feed.rail)) railToRail.push(feed.rail);
    }
  }

  const loop = findLoop(power, feedsOf);
  if (loop !== null) return fail(`the connections form a loop through ${loop.label}: power in a rung flows left to right only`);

  const groups = connectedGroups(power, feedsOf);
  // A left rail wired straight to the right rail is an empty branch of the one rung that rail
  // feeds (our exporter gives each rung its own rails), or else an empty rung of its own.
  const groupsOfRail = (rail: RailRecord): number[] =>
    groups.flatMap((members, index) =>
      members.some((m) => (feedsOf.get(m.localId) ?? []).some((f) => f.kind === 'rail' && f.rail === rail)) ? [index] : [],
    );
  const bypassed = new Set<number>();
  const rungs: RecoveredRung[] = [];
  for (const rail of railToRail) {
    const fed = groupsOfRail(rail);
    if (fed.length === 1) bypassed.add(fed[0] as number);
    else rungs.push({ network: { kind: 'wire' }, members: [], rails: [rail], y: rail.y, firstLocalId: rail.localId });
  }
  for (const [index, members] of groups.entries()) {
    const rung = reduceGroup(members, feedsOf, toRightRail, bypassed.has(index));
    if (!rung.ok) return rung;
    rungs.push(rung.value);
  }
  rungs.sort((a, b) => a.y - b.y || a.firstLocalId - b.firstLocalId);
  return ok(rungs);
}

function resolveFeeds(wires: readonly Wire[], label: string, byId: ReadonlyMap<number, BodyRecord>): Result<Feed[]> {
  const feeds: Feed[] = [];
  for (const wire of wires) {
    const source = byId.get(wire.refLocalId);
    if (source === undefined) return fail(`${label} is connected to localId ${wire.refLocalId}, which is not in the LD body`);
    if (source.kind === 'leftRail') feeds.push({ kind: 'rail', rail: source });
    else if (source.kind === 'contact' || source.kind === 'coil') feeds.push({ kind: 'element', element: source });
    else if (source.kind === 'block') {
      const problem = blockOutputProblem(source, wire, label);
      if (problem) return fail(problem);
      feeds.push({ kind: 'element', element: source });
    } else if (source.kind === 'inVariable') {
      return fail(`${label} takes power flow from ${source.label}: in Rungwright power comes from the left rail through contacts; a variable feeds only a block's operand inputs`);
    } else {
      return fail(`${label} is connected to ${source.label}, which has no output: power flows from the left rail to the right rail`);
    }
  }
  const seen = new Set<string>();
  return ok(feeds.filter((feed) => {
    const key = feedKey(feed);
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  }));
}

/** Only the block's power-flow output (Q, QU, Q1) can carry a rung on. */
function blockOutputProblem(block: BlockRecord, wire: Wire, label: string): string | null {
  const spec = BLOCK_SPECS[block.type];
  const pin = wire.formalParameter ?? spec.powerOut;
  if (pin === spec.powerOut) return null;
  const known = spec.outputs.some((p) => p.name === pin);
  if (!known) return `${label} is connected to output "${pin}" of ${block.label}, which ${block.type} does not have`;
  return `${label} is connected to output ${pin} of ${block.label}: only ${spec.powerOut} carries a rung on; read ${pin} elsewhere as the operand ${block.instance || block.type}.${pin}`;
}

/** All left rails are one source, so every rail feed has one key. */
function feedKey(feed: Feed): string {
  return feed.kind === 'rail' ? SOURCE : `o${feed.element.localId}`;
}

/** An element that feeds itself through other elements, or `null`. */
function findLoop(power: readonly PowerElement[], feedsOf: ReadonlyMap<number, Feed[]>): PowerElement | null {
  const state = new Map<number, 'open' | 'done'>();
  for (const start of power) {
    if (state.has(start.localId)) continue;
    // Iterative depth-first search: a long rung must not exhaust the stack.
    const stack: Array<{ element: PowerElement; next: number }> = [{ element: start, next: 0 }];
    state.set(start.localId, 'open');
    while (stack.length > 0) {
      const top = stack[stack.length - 1] as { element: PowerElement; next: number };
      const feeds = feedsOf.get(top.element.localId) ?? [];
      if (top.next >= feeds.length) {
        state.set(top.element.localId, 'done');
        stack.pop();
        continue;
      }
      const feed = feeds[top.next] as Feed;
      top.next += 1;
      if (feed.kind !== 'element') continue;
      const seen = state.get(feed.element.localId);
      if (seen === 'open') return feed.element;
      if (seen === undefined) {
        state.set(feed.element.localId, 'open');
        stack.push({ element: feed.element, next: 0 });
      }
    }
  }
  return null;
}

/**
 * Elements joined by connections. The rails join nothing (one pair of rails may serve every rung),
 * except where Rungwright's own `addData` names the rung of a left rail: our exporter gives each
 * rung its own rails, so branches that meet only at the rails stay one rung.
 */
function connectedGroups(power: readonly PowerElement[], feedsOf: ReadonlyMap<number, Feed[]>): PowerElement[][] {
  const parent = new Map<string, string>();
  const root = (key: string): string => {
    let r = key;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r) as string;
    parent.set(key, r);
    return r;
  };
  const join = (a: string, b: string): void => {
    const ra = root(a);
    const rb = root(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  for (const element of power) {
    const key = `e${element.localId}`;
    root(key);
    for (const feed of feedsOf.get(element.localId) ?? []) {
      if (feed.kind === 'element') join(key, `e${feed.element.localId}`);
      else if (feed.rail.rungId) join(key, `rung:${feed.rail.rungId}`);
    }
  }
  const groups = new Map<string, PowerElement[]>();
  for (const element of [...power].sort((a, b) => a.localId - b.localId)) {
    const key = root(`e${element.localId}`);
    groups.set(key, [...(groups.get(key) ?? []), element]);
  }
  return [...groups.values()];
}

/** Reduce one group's two-terminal graph to a single series-parallel tree. */
function reduceGroup(
  members: PowerElement[],
  feedsOf: ReadonlyMap<number, Feed[]>,
  toRightRail: ReadonlySet<number>,
  bypassed: boolean,
): Result<RecoveredRung> {
  const edges = new Map<number, Edge>();
  let nextEdge = 0;
  const addEdge = (edge: Edge): void => {
    edges.set(nextEdge, edge);
    nextEdge += 1;
  };
  const consumed = new Set<string>();
  const rails = new Map<number, RailRecord>();
  const junctionSets = new Map<string, string[]>();
  for (const element of members) {
    const feeds = feedsOf.get(element.localId) ?? [];
    const keys = feeds.map(feedKey).sort();
    for (const feed of feeds) {
      if (feed.kind === 'rail') rails.set(feed.rail.localId, feed.rail);
      consumed.add(feedKey(feed));
    }
    // A single feed needs no junction: the element hangs straight off that output.
    const junction = keys.length === 1 ? (keys[0] as string) : `j[${keys.join(',')}]`;
    if (keys.length > 1) junctionSets.set(junction, keys);
    addEdge({ from: junction, to: `o${element.localId}`, tree: { kind: 'element', element } });
  }
  // An output that feeds nothing ends at the right rail, drawn or not: a coil needs no wire after it.
  const sinkKeys = members
    .filter((element) => toRightRail.has(element.localId) || !consumed.has(`o${element.localId}`))
    .map((element) => `o${element.localId}`);
  if (bypassed) sinkKeys.push(SOURCE);

  // Wire each junction (and the right rail) from its feeds. Where the feeds of one junction are all
  // among another's, the bigger one is fed through the smaller (OR is associative, so the logic is
  // the same): that is how an empty branch shows in TC6, a feed passed on beside the others.
  const bySize = [...junctionSets].sort((a, b) => b[1].length - a[1].length);
  const wireUp = (target: string, keys: readonly string[]): void => {
    const left = new Set(keys);
    for (const [junction, subset] of bySize) {
      if (junction === target || subset.length > keys.length || !subset.every((k) => left.has(k))) continue;
      subset.forEach((k) => left.delete(k));
      addEdge({ from: junction, to: target, tree: { kind: 'wire' } });
    }
    for (const key of left) addEdge({ from: key, to: target, tree: { kind: 'wire' } });
  };
  for (const [junction, keys] of junctionSets) wireUp(junction, keys);
  wireUp(SINK, sinkKeys);

  const reduced = reduceEdges(edges);
  const first = members[0] as PowerElement;
  if (reduced === null) {
    const involved = members.map((m) => m.localId).join(', ');
    return fail(
      `the rung that starts at ${first.label} is not series-parallel: its wires cross between branches (elements ${involved}), which a Rungwright rung cannot draw; redraw it as series and parallel branches`,
    );
  }
  if (depth(reduced) > MAX_NESTING) return fail(`the rung that starts at ${first.label} nests branches more than ${MAX_NESTING} deep`);
  const network = ordered(reduced);
  return ok({
    network,
    members,
    rails: [...rails.values()],
    y: Math.min(...members.map((m) => m.y)),
    firstLocalId: first.localId,
  });
}
