/**
 * PLCopen TC6 XML 2.01 exchange of a Rungwright program with an LD body ("PLCopen TC6 XML Formats
 * for IEC 61131-3, Version 2.01"): `exportPlcopen` writes one, `importPlcopen` reads one back, or
 * one another tool wrote.
 */
export { exportPlcopen, type ExportPlcopenOptions } from './exportProject';
export { importPlcopen, type ImportPlcopenOptions, type ImportedProgram } from './importProject';
export { DEFAULT_MAX_IMPORT_BYTES } from './guard';
export { TC6_NAMESPACE } from './constants';
