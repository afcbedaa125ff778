/**
 * The public API of `shared/ladder`: the program document, its operands, validation, edits and
 * renderings.
 */
export * from './schema';
export * from './blocks';
export * from './result';
export * from './time';
export * from './addresses';
export * from './operands';
export * from './diagnostics';
export * from './ids';
export * from './restore';
export * from './bounds';
export * from './walk';
export * from './shape';
export * from './validate';
export * from './validateTags';
export * from './edits';
export * from './text';
export * from './st';
export * from './diff';
// PLCopen TC6 XML import/export (shared/ladder/plcopen/) is exported below by its own module.
export * from './plcopen';
