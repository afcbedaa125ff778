/**
 * A small, plain XML tree over fast-xml-parser's order-preserving form, so the PLCopen reader and
 * writer work with `{ name, attrs, children }` records instead of the library's array shapes.
 * Namespace prefixes are kept in `name` (`xhtml:p`); `localName` strips them.
 */
import { XMLBuilder, XMLParser } from 'fast-xml-parser';

/** One XML element. Text content is held in `text` children. */
export interface XmlElement {
  type: 'element';
  /** The qualified name as written, prefix included. */
  name: string;
  attrs: Record<string, string>;
  children: XmlNode[];
}

/** Character data (text or CDATA), entities already decoded. */
export interface XmlText {
  type: 'text';
  value: string;
}

export type XmlNode = XmlElement | XmlText;

/**
 * Characters XML 1.0 (2.2) does not allow at all: C0 controls other than tab, line feed and carriage
 * return, lone surrogates, U+FFFE and U+FFFF. They are dropped so a written file always parses.
 */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const NOT_XML_CHARACTER = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/** Text as XML can carry it: forbidden characters dropped, line ends as `\n` (XML 1.0, 2.11 would do it on reading). */
export function xmlSafeText(value: string): string {
  return value.replace(NOT_XML_CHARACTER, '').replace(/\r\n?/g, '\n');
}

/**
 * Build an element; attributes whose value is `undefined` are left out. Tabs and line ends in an
 * attribute become spaces, as every reader's attribute-value normalisation (XML 1.0, 3.3.3) would.
 */
export function el(name: string, attrs: Record<string, string | number | undefined> = {}, children: XmlNode[] = []): XmlElement {
  const kept: Record<string, string> = {};
  for (const [key, value] of Object.entries(attrs)) {
    if (value !== undefined) kept[key] = xmlSafeText(String(value)).replace(/[\t\n]/g, ' ');
  }
  return { type: 'element', name, attrs: kept, children };
}

/** A text node (made XML-safe, see `xmlSafeText`). */
export function text(value: string): XmlText {
  return { type: 'text', value: xmlSafeText(value) };
}

/** The name without its namespace prefix: `xhtml:p` → `p`. */
export function localName(element: XmlElement): string {
  const colon = element.name.indexOf(':');
  return colon < 0 ? element.name : element.name.slice(colon + 1);
}

/** The element children, text left out. */
export function elementChildren(element: XmlElement): XmlElement[] {
  return element.children.filter((child): child is XmlElement => child.type === 'element');
}

/** The first child element with this local name. */
export function child(element: XmlElement, name: string): XmlElement | undefined {
  return elementChildren(element).find((c) => localName(c) === name);
}

/** Every child element with this local name, in document order. */
export function childrenNamed(element: XmlElement, name: string): XmlElement[] {
  return elementChildren(element).filter((c) => localName(c) === name);
}

/** All text below an element, concatenated in document order. */
export function textContent(node: XmlNode): string {
  if (node.type === 'text') return node.value;
  return node.children.map(textContent).join('');
}

/** Every element below `root` (root excluded), depth first in document order. */
export function descendants(root: XmlElement): XmlElement[] {
  const found: XmlElement[] = [];
  const walk = (element: XmlElement): void => {
    for (const c of elementChildren(element)) {
      found.push(c);
      walk(c);
    }
  };
  walk(root);
  return found;
}

type OrderedEntry = Record<string, unknown> & { ':@'?: Record<string, string> };

/** Deeper nesting than any PLCopen file needs (about 12 levels) is refused by the parser. */
export const MAX_XML_DEPTH = 100;

const PARSER_OPTIONS = {
  maxNestedTags: MAX_XML_DEPTH,
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: '',
  // Keep every value as written: `00012` is a name or a literal to us, never a number.
  parseTagValue: false,
  parseAttributeValue: false,
  trimValues: false,
  // Predefined and numeric character references only: the guard has refused any DOCTYPE, so no
  // declared entity can reach the parser, and an undefined reference was refused as well.
  processEntities: true,
  htmlEntities: true,
  ignoreDeclaration: true,
  ignorePiTags: true,
} as const;

/**
 * Parse a document already checked by `checkXmlInput` into its top-level elements (XML 1.0, 2.1,
 * allows exactly one; the validator accepts several, so the caller checks).
 */
export function parseXmlRoots(xml: string): XmlElement[] {
  const parser = new XMLParser(PARSER_OPTIONS);
  const entries = parser.parse(xml) as OrderedEntry[];
  return entries.map(fromOrdered).filter((n): n is XmlElement => n !== undefined && n.type === 'element');
}

function fromOrdered(entry: OrderedEntry): XmlNode | undefined {
  for (const key of Object.keys(entry)) {
    if (key === ':@') continue;
    const value = entry[key];
    if (key === '#text') return text(String(value));
    if (key === '#comment' || key.startsWith('?')) return undefined;
    const children = (Array.isArray(value) ? (value as OrderedEntry[]) : [])
      .map(fromOrdered)
      .filter((n): n is XmlNode => n !== undefined);
    return { type: 'element', name: key, attrs: { ...(entry[':@'] ?? {}) }, children };
  }
  return undefined;
}

/** Serialise a root element as an indented UTF-8 XML document with its declaration. */
export function buildXmlDocument(root: XmlElement): string {
  const builder = new XMLBuilder({
    preserveOrder: true,
    ignoreAttributes: false,
    attributeNamePrefix: '',
    format: true,
    indentBy: '  ',
    suppressEmptyNode: true,
    processEntities: true,
  });
  const body = builder.build([toOrdered(root)]) as string;
  return `<?xml version="1.0" encoding="UTF-8"?>\n${body.replace(/^\n+/, '')}`;
}

function toOrdered(node: XmlNode): OrderedEntry {
  if (node.type === 'text') return { '#text': node.value };
  const entry: OrderedEntry = { [node.name]: node.children.map(toOrdered) };
  if (Object.keys(node.attrs).length > 0) entry[':@'] = { ...node.attrs };
  return entry;
}
