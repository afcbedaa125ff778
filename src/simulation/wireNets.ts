/**
 * Which conductors of a drawn rung are connected. The layout tags the wires on either side of an
 * element with the element's id (`flow`); the others — lead-ins, branch stubs, vertical links,
 * stretches — carry whatever their connected net carries. This groups every wire with the tagged
 * wires it touches, so a live view can colour the untagged ones too: a net is energised when a
 * tagged wire in it is. Pure geometry over the layout, computed once per layout, not per scan.
 */
import type { WireSegment } from '@/editor/layoutTypes';

/** For each wire (by index): the indices of the tagged wires in its net (itself, if tagged). */
export type WireNets = readonly (readonly number[])[];

const EPS = 0.01;

/** Does point (x, y) lie on the segment (axis-parallel or not)? */
function touches(s: WireSegment, x: number, y: number): boolean {
  const minX = Math.min(s.x1, s.x2) - EPS;
  const maxX = Math.max(s.x1, s.x2) + EPS;
  const minY = Math.min(s.y1, s.y2) - EPS;
  const maxY = Math.max(s.y1, s.y2) + EPS;
  if (x < minX || x > maxX || y < minY || y > maxY) return false;
  const cross = (s.x2 - s.x1) * (y - s.y1) - (s.y2 - s.y1) * (x - s.x1);
  return Math.abs(cross) <= EPS * Math.max(1, Math.hypot(s.x2 - s.x1, s.y2 - s.y1));
}

/** Group wires into nets: two wires join where an end of one lies on the other. */
export function wireNets(wires: readonly WireSegment[]): WireNets {
  const parent = wires.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]!]!;
      i = parent[i]!;
    }
    return i;
  };
  const join = (a: number, b: number): void => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };
  for (let i = 0; i < wires.length; i += 1) {
    for (let j = 0; j < wires.length; j += 1) {
      if (i === j) continue;
      const a = wires[i]!;
      const b = wires[j]!;
      if (touches(b, a.x1, a.y1) || touches(b, a.x2, a.y2)) join(i, j);
    }
  }
  const tagged = new Map<number, number[]>();
  wires.forEach((w, i) => {
    if (!w.flow) return;
    const root = find(i);
    tagged.set(root, [...(tagged.get(root) ?? []), i]);
  });
  return wires.map((w, i) => (w.flow ? [i] : (tagged.get(find(i)) ?? [])));
}

/**
 * Is wire `index` energised? A tagged wire by its element's side; an untagged one when any tagged
 * wire of its net is; `leftRail` decides a net with no tagged wire (the bare lead-in of an empty rung).
 */
export function wireEnergised(
  wires: readonly WireSegment[],
  nets: WireNets,
  index: number,
  sideEnergised: (nodeId: string, side: 'in' | 'out') => boolean,
  touchesLeftRail: (wire: WireSegment) => boolean,
): boolean {
  const w = wires[index]!;
  if (w.flow) return sideEnergised(w.flow.nodeId, w.flow.side);
  const members = nets[index]!;
  if (members.length === 0) return touchesLeftRail(w);
  return members.some((m) => {
    const f = wires[m]!.flow!;
    return sideEnergised(f.nodeId, f.side);
  });
}
