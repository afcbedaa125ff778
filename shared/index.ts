/**
 * The public facade of `shared/`: what the browser app, the server and the command line use.
 * Pure and deterministic throughout — no DOM, no Node, no clock, no global random.
 */
export * from './ladder';
export * from './engine';
export * from './field';
export * from './checks';
// The standard labs (their check scripts and reference solutions) are server-only: import them
// from `labs/` where they are needed, never through this facade, which the browser may use.
export { SAFETY_CAUTION } from './labs/safetyCaution';
