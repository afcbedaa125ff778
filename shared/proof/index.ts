/** Proof: every behaviour of a program on a panel explored, properties decided with replayed counterexamples. */
export * from './property';
export { ABSTRACTIONS } from './abstraction';
export { prove } from './prove';
export { DEFAULT_MAX_STATES, type PropertyResult, type ProveOptions, type ProveResult, type Verdict } from './decide';
export { proofReport, PROOF_REPORT_FORMAT, proofExitCode, type ProofReport } from './report';
