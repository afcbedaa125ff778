/** Check scripts: the format, its validation against a panel, the runner and the grade report. */
export * from './script';
export * from './parseScript';
export * from './againstPanel';
export * from './report';
export * from './trace';
export * from './runner';
