/**
 * The two small pieces of markup every PLCopen element may carry: `formattedText` (comments and
 * documentation, XHTML inside) and `addData` (tool-specific data a reader may discard).
 */
import { ADD_DATA, RUNGWRIGHT_NAMESPACE, XHTML_NAMESPACE } from './constants';
import { child, childrenNamed, el, elementChildren, localName, text, textContent, xmlSafeText, type XmlElement } from './xmlTree';

/** `formattedText`: one XHTML paragraph per line, so another tool shows the line breaks. */
export function formattedText(name: string, value: string): XmlElement {
  const paragraphs = xmlSafeText(value).split('\n').map((line) => el('xhtml:p', { 'xmlns:xhtml': XHTML_NAMESPACE }, line === '' ? [] : [text(line)]));
  return el(name, {}, paragraphs);
}

/** Read a `formattedText` back: each child element is a line; bare text is taken as it stands. */
export function readFormattedText(element: XmlElement | undefined): string {
  if (element === undefined) return '';
  const parts = elementChildren(element);
  if (parts.length === 0) return textContent(element).trim();
  return parts.map((part) => textContent(part)).join('\n');
}

export type AddDataKind = keyof typeof ADD_DATA;

/** `addData` holding one Rungwright record, e.g. `<rw:element rung="r1" id="c3"/>`. */
export function rungwrightAddData(kind: AddDataKind, attrs: Record<string, string>): XmlElement {
  const record = el(`rw:${kind}`, { 'xmlns:rw': RUNGWRIGHT_NAMESPACE, ...attrs });
  return el('addData', {}, [el('data', { name: ADD_DATA[kind], handleUnknown: 'discard' }, [record])]);
}

/** The attributes of our record in an element's `addData`, if it carries one. */
export function readRungwrightAddData(owner: XmlElement, kind: AddDataKind): Record<string, string> | undefined {
  const addData = child(owner, 'addData');
  if (addData === undefined) return undefined;
  for (const data of childrenNamed(addData, 'data')) {
    if (data.attrs.name !== ADD_DATA[kind]) continue;
    const record = elementChildren(data).find((c) => localName(c) === kind);
    if (record !== undefined) return record.attrs;
  }
  return undefined;
}
