/**
 * The public facade of `shared/`: what the browser app, the server and the command line use.
 * Pure and deterministic throughout — no DOM, no Node, no clock, no global random.
 */
export * from './ladder';
export * from './engine';
export * from './field';
export * from './checks';
export { STANDARD_LABS, standardLab, SAFETY_CAUTION, type Lab } from './labs';
