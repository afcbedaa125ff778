/**
 * A simple grid layout of a rung network, only so another tool can draw an exported file: series
 * items go left to right, parallel branches top to bottom. The importer never reads positions to
 * find topology; it uses them only to order rungs and branches.
 */
import { BLOCK_SPECS } from '../blocks';
import type { Element, NetworkNode } from '../schema';

/** Where an element sits, in grid cells from the rung's top-left corner. */
export interface Cell {
  col: number;
  row: number;
  /** Columns and rows the element takes. */
  cols: number;
  rows: number;
}

/** The grid of one rung. */
export interface RungGrid {
  cols: number;
  rows: number;
  /** By element id. */
  cells: Map<string, Cell>;
}

/** Columns and rows an element takes: a block needs a column for its constants and a row per pin. */
export function elementSize(element: Element): { cols: number; rows: number } {
  if (element.kind !== 'block') return { cols: 1, rows: 1 };
  const spec = BLOCK_SPECS[element.type];
  return { cols: 2, rows: Math.max(spec.inputs.length, spec.outputs.length) };
}

/** Lay out a rung's network on the grid. */
export function layoutNetwork(network: NetworkNode): RungGrid {
  const cells = new Map<string, Cell>();
  const place = (node: NetworkNode, col: number, row: number): { cols: number; rows: number } => {
    if (node.kind === 'series') {
      let used = 0;
      let rows = 1;
      for (const item of node.items) {
        const size = place(item, col + used, row);
        used += size.cols;
        rows = Math.max(rows, size.rows);
      }
      return { cols: used, rows };
    }
    if (node.kind === 'parallel') {
      let used = 0;
      let cols = 0;
      for (const branch of node.branches) {
        const size = place(branch, col, row + used);
        used += size.rows;
        cols = Math.max(cols, size.cols);
      }
      return { cols, rows: Math.max(used, 1) };
    }
    const size = elementSize(node);
    cells.set(node.id, { col, row, ...size });
    return size;
  };
  const size = place(network, 0, 0);
  return { cols: size.cols, rows: size.rows, cells };
}
