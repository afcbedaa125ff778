/** Check scripts: the format, its validation against a panel, the runner, the grade report and its student views. */
export * from './script';
export * from './parseScript';
export * from './againstPanel';
export * from './report';
export * from './redact';
export * from './studentScript';
export * from './stepWords';
export * from './trace';
export * from './runner';
