/**
 * The rung shape rule.
 *
 * A rung network is a series. Power enters on the left rail and must end in outputs on the right:
 * the coils (and a final block) sit at the end, either as the last items of the root series or as
 * a final parallel whose branches each end in coils or a block ("a rung may drive several outputs
 * in parallel"); such a final branch may hold contacts before its coils. Blocks may also sit in the
 * middle of a series: power flow passes through their Q/QU/Q1 output. In any series, once a coil
 * appears only coils may follow it, and a coil anywhere else (inside a parallel that something
 * follows) is "in the middle of the rung". A branch that is empty joins its ends directly (a short
 * circuit across the branches beside it), so it is an error too.
 */
import { createDiagnostic, type Diagnostic } from './diagnostics';
import type { NetworkNode, Parallel, Rung, Series } from './schema';

/** True when power leaving this node reaches an output: it ends in a coil or a block. */
export function endsInOutput(node: NetworkNode): boolean {
  switch (node.kind) {
    case 'coil':
    case 'block':
      return true;
    case 'contact':
      return false;
    case 'series': {
      const last = node.items.at(-1);
      return last !== undefined && endsInOutput(last);
    }
    case 'parallel':
      return node.branches.length > 0 && node.branches.every(endsInOutput);
  }
}

/** Index of the first item of a series' output tail: trailing coils, or a final output parallel. */
export function outputTailStart(series: Series): number {
  let start = series.items.length;
  while (start > 0 && series.items[start - 1]!.kind === 'coil') start -= 1;
  if (start === series.items.length) {
    const last = series.items.at(-1);
    if (last?.kind === 'parallel' && last.branches.some(endsInOutput)) start -= 1;
  }
  return start;
}

/** Check a rung against the shape rule. */
export function checkRungShape(rung: Rung): Diagnostic[] {
  const found: Diagnostic[] = [];
  reportRungShape(rung, found);
  return found;
}

/**
 * The walk through one rung. `path` is the path of the node being checked, pushed and popped as
 * the walk goes (a diagnostic copies it), so a rung without mistakes allocates nothing per node:
 * validation runs on every edit of a running program.
 */
interface ShapeWalk {
  readonly rungId: string;
  readonly path: number[];
  readonly found: Diagnostic[];
}

const at = (walk: ShapeWalk, elementId: string | null = null) => ({ rungId: walk.rungId, path: walk.path, elementId });

/** `checkRungShape`, appending what is wrong to `found`. */
export function reportRungShape(rung: Rung, found: Diagnostic[]): void {
  const walk: ShapeWalk = { rungId: rung.id, path: [], found };
  const root = rung.network;

  if (root.items.length === 0) {
    found.push(createDiagnostic('empty-rung', {}, at(walk)));
    return;
  }

  checkSeries(root, walk, true);
  const last = root.items.at(-1);
  const branchesReported = last?.kind === 'parallel' && last.branches.some(endsInOutput);
  if (!endsInOutput(root) && !branchesReported) found.push(createDiagnostic('rung-without-output', {}, at(walk)));
}

/** Index of the last item that is neither a coil nor a contact, -1 when there is none. */
function lastOtherThanCoilOrContact(items: readonly NetworkNode[]): number {
  let index = items.length - 1;
  while (index >= 0 && (items[index]!.kind === 'coil' || items[index]!.kind === 'contact')) index -= 1;
  return index;
}

function checkSeries(series: Series, walk: ShapeWalk, atRightEnd: boolean): void {
  const { items } = series;
  const { path, found } = walk;
  let seenCoil = false;
  let lastOther = -1;
  for (let index = 0; index < items.length; index += 1) {
    const item = items[index]!;
    path.push(index);
    if (item.kind === 'coil') {
      if (!seenCoil) lastOther = lastOtherThanCoilOrContact(items);
      seenCoil = true;
      // Contacts after a coil get their own message below; here only what else makes the coil "mid-rung".
      if (!atRightEnd || lastOther > index) found.push(createDiagnostic('coil-mid-rung', { operand: shown(item.operand) }, at(walk, item.id)));
    } else if (item.kind === 'contact') {
      if (seenCoil) found.push(createDiagnostic('contact-after-coil', { operand: shown(item.operand) }, at(walk, item.id)));
    } else if (item.kind !== 'block') {
      checkGroup(item, walk, atRightEnd && index === items.length - 1);
    }
    path.pop();
  }
}

function checkGroup(node: Series | Parallel, walk: ShapeWalk, atRightEnd: boolean): void {
  const { path, found } = walk;
  if (node.kind === 'series') {
    if (node.items.length === 0) found.push(createDiagnostic('empty-group', { what: 'series' }, at(walk)));
    checkSeries(node, walk, atRightEnd);
    return;
  }
  const { branches } = node;
  if (branches.length === 0) {
    found.push(createDiagnostic('empty-group', { what: 'parallel branch' }, at(walk)));
    return;
  }
  // In a final parallel that drives outputs, every branch must drive one.
  const everyBranchDrives = atRightEnd && branches.some(endsInOutput);
  for (let index = 0; index < branches.length; index += 1) {
    const branch = branches[index]!;
    path.push(index);
    if (branch.kind === 'series' && branch.items.length === 0) {
      found.push(createDiagnostic('empty-branch', {}, at(walk)));
    } else {
      if (everyBranchDrives && !endsInOutput(branch)) found.push(createDiagnostic('branch-without-output', {}, at(walk)));
      if (branch.kind === 'series') checkSeries(branch, walk, atRightEnd);
      else if (branch.kind === 'parallel') checkGroup(branch, walk, atRightEnd);
      else if (branch.kind === 'coil' && !atRightEnd) {
        found.push(createDiagnostic('coil-mid-rung', { operand: shown(branch.operand) }, at(walk, branch.id)));
      }
    }
    path.pop();
  }
}

function shown(operand: string): string {
  return operand.trim() === '' ? '(no operand)' : operand.trim();
}
