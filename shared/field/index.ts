/** The virtual field panel: device models, panel layouts, and the simulation that couples them to the engine. */
export * from './devices';
export * from './layout';
export * from './parseLayout';
export * from './panels';
export * from './wiring';
export * from './events';
export * from './views';
export * from './explain';
export * from './simulation';
export { formatIssues, formatPath } from './issues';
export { describeCommons, ACTION_WORDS } from './messages';
