/** The messages between the proof bench page and its worker (proof-page-main.ts, proof-page-worker.ts). */
import type { Program } from '@shared/ladder/schema';
import type { Property } from '@shared/proof';

/** Page → worker: decide these properties on this program (the reversing-conveyor panel). */
export interface ProveRequest {
  id: number;
  program: Program;
  properties: Property[];
}

/** Worker → page: the verdicts, the states of every search counted once, and the worker's own ms. */
export type WorkerMessage =
  | { kind: 'ready' }
  | { kind: 'proved'; id: number; verdicts: string[]; states: number; transitions: number; ms: number }
  | { kind: 'failed'; id: number; error: string }
  | { kind: 'violation'; text: string };
