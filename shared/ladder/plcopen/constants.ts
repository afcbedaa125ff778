/**
 * Names and numbers of the PLCopen exchange: the TC6 namespace, our own `addData` names, and the
 * grid the exporter lays rungs out on. Element and attribute names follow "PLCopen TC6 XML Formats
 * for IEC 61131-3, Version 2.01" (the element order inside each sequence is from memory of the
 * schema `tc6_xml_v201.xsd`, which carries no open licence and is not kept here).
 */

/** The TC6 XML 2.01 namespace (docs/published-values.md, PLCopen). */
export const TC6_NAMESPACE = 'http://www.plcopen.org/xml/tc6_0201';
/** `formattedText` (comments, documentation) holds XHTML. */
export const XHTML_NAMESPACE = 'http://www.w3.org/1999/xhtml';
/** Our own namespace for the elements inside `addData/data`; a URN, so it names no host. */
export const RUNGWRIGHT_NAMESPACE = 'urn:rungwright';

/**
 * `addData/data` names (`name` is an xsd:anyURI). Other tools drop what they do not know
 * (`handleUnknown="discard"`); Rungwright reads them back so a round trip keeps its ids.
 */
export const ADD_DATA = {
  /**
   * On a left rail: the rung id, and `elements="3=con1 4=coil2"` mapping each element's localId to
   * its Rungwright id. On a rung comment: the rung id.
   */
  rung: 'urn:rungwright:rung',
  /** On a variable the exporter declared for a memory bit used without a tag. */
  untagged: 'urn:rungwright:untagged',
} as const;

export const PRODUCT_NAME = 'Rungwright';
export const PRODUCT_VERSION = '0.1.0';
export const COMPANY_NAME = 'Rungwright';
/** Name of the one program POU; IEC 61131-3 identifiers cannot hold a free-text title. */
export const POU_NAME = 'Main';
/** docs/check-scripts.md: the simulator's default scan period, written as the task interval. */
export const TASK_INTERVAL = 'T#10ms';
/** Written when the caller passes no `now`: `shared/` reads no clock. */
export const DEFAULT_CREATION_DATE_TIME = '1970-01-01T00:00:00Z';

/**
 * The export grid, in the file's coordinate units (scaling 1:1). One contact or coil per cell; a
 * block takes two columns (its constants on the left) and one row per pin.
 */
export const GRID = {
  cellWidth: 80,
  cellHeight: 60,
  /** Contact and coil box. */
  elementWidth: 40,
  elementHeight: 20,
  blockWidth: 60,
  inVariableWidth: 60,
  inVariableHeight: 20,
  railWidth: 4,
  /** Gap between the left rail and the first column, and after the last column. */
  margin: 20,
  /** Height of the band a rung comment takes above its rung. */
  commentBand: 50,
  commentHeight: 40,
  /** Space between two rungs. */
  rungGap: 20,
} as const;
