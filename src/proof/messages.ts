/** What the page and the prover's worker say to each other (plain, structured-cloneable data). */
import type { PanelLayout } from '@shared/field/layout';
import type { Program } from '@shared/ladder/schema';
import type { Property, ProveResult } from '@shared/proof';

export interface ProveRequest {
  type: 'prove';
  runId: number;
  program: Program;
  panel: PanelLayout;
  properties: Property[];
  scanMs?: number;
}

/**
 * Asked when the Proof tab opens: a small proof on an empty program, so the worker's code is
 * loaded and compiled by the engine before the first real run (no answer is sent).
 */
export interface WarmRequest {
  type: 'warm';
  program: Program;
  panel: PanelLayout;
  properties: Property[];
}

export type WorkerAnswer =
  /** States visited and scans from power-up covered so far, a few times a second. */
  | { type: 'progress'; runId: number; states: number; depth: number }
  | { type: 'done'; runId: number; result: ProveResult; ms: number }
  /** The prover threw: a fault of ours, shown as such. */
  | { type: 'failed'; runId: number; message: string };

/** How often progress is posted, ms. */
export const PROGRESS_EVERY_MS = 200;
