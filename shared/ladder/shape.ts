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
import type { NetworkNode, Rung, Series } from './schema';

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
  const at = (path: number[], elementId: string | null = null) => ({ rungId: rung.id, path, elementId });
  const root = rung.network;

  if (root.items.length === 0) {
    found.push(createDiagnostic('empty-rung', {}, at([])));
    return found;
  }

  const checkSeries = (series: Series, path: number[], atRightEnd: boolean): void => {
    let firstCoil: number | null = null;
    series.items.forEach((item, index) => {
      const itemPath = [...path, index];
      const isLast = index === series.items.length - 1;
      if (item.kind === 'coil') {
        if (firstCoil === null) firstCoil = index;
        const onlyCoilsAfter = series.items.slice(index + 1).every((next) => next.kind === 'coil' || next.kind === 'contact');
        // Contacts after a coil get their own message below; here only what else makes the coil "mid-rung".
        if (!atRightEnd || !onlyCoilsAfter) found.push(createDiagnostic('coil-mid-rung', { operand: shown(item.operand) }, at(itemPath, item.id)));
        return;
      }
      if (item.kind === 'contact') {
        if (firstCoil !== null) found.push(createDiagnostic('contact-after-coil', { operand: shown(item.operand) }, at(itemPath, item.id)));
        return;
      }
      if (item.kind === 'block') return;
      checkGroup(item, itemPath, atRightEnd && isLast);
    });
  };

  const checkGroup = (node: NetworkNode, path: number[], atRightEnd: boolean): void => {
    if (node.kind === 'series') {
      if (node.items.length === 0) found.push(createDiagnostic('empty-group', { what: 'series' }, at(path)));
      checkSeries(node, path, atRightEnd);
      return;
    }
    if (node.kind !== 'parallel') return;
    if (node.branches.length === 0) {
      found.push(createDiagnostic('empty-group', { what: 'parallel branch' }, at(path)));
      return;
    }
    const outputBranches = node.branches.filter(endsInOutput).length;
    node.branches.forEach((branch, index) => {
      const branchPath = [...path, index];
      if (branch.kind === 'series' && branch.items.length === 0) {
        found.push(createDiagnostic('empty-branch', {}, at(branchPath)));
        return;
      }
      // In a final parallel that drives outputs, every branch must drive one.
      if (atRightEnd && outputBranches > 0 && !endsInOutput(branch)) {
        found.push(createDiagnostic('branch-without-output', {}, at(branchPath)));
      }
      if (branch.kind === 'series') checkSeries(branch, branchPath, atRightEnd);
      else if (branch.kind === 'parallel') checkGroup(branch, branchPath, atRightEnd);
      else if (branch.kind === 'coil' && !atRightEnd) {
        found.push(createDiagnostic('coil-mid-rung', { operand: shown(branch.operand) }, at(branchPath, branch.id)));
      }
    });
  };

  checkSeries(root, [], true);
  const last = root.items.at(-1);
  const branchesReported = last?.kind === 'parallel' && last.branches.some(endsInOutput);
  if (!endsInOutput(root) && !branchesReported) found.push(createDiagnostic('rung-without-output', {}, at([])));
  return found;
}

function shown(operand: string): string {
  return operand.trim() === '' ? '(no operand)' : operand.trim();
}
