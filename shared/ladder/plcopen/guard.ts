/**
 * Checks on raw XML text before anything parses it: size, document type declarations and entity
 * declarations (the "billion laughs" and external-entity attacks both need one), undefined entity
 * references, and well-formedness with a line and column.
 */
import { XMLValidator } from 'fast-xml-parser';
import { fail, ok, type Result } from '../result';

/**
 * 1 MB. Our exports take about 6 KB a rung of ten elements (positions, pins, indentation), so this
 * holds some 150 such rungs: far more than a lab program; raise it per call for bigger files.
 */
export const DEFAULT_MAX_IMPORT_BYTES = 1_048_576;

/** The five entities XML predefines (XML 1.0, 4.6); any other needs a DTD, which we refuse. */
const PREDEFINED_ENTITIES = new Set(['amp', 'lt', 'gt', 'quot', 'apos']);

/** Refuse input that must not reach the parser; `ok` carries nothing. */
export function checkXmlInput(xml: unknown, maxBytes: number): Result<true> {
  if (typeof xml !== 'string') return fail('the PLCopen file must be given as text');
  const bytes = utf8Length(xml, maxBytes);
  if (bytes > maxBytes) {
    return fail(`the file is too large: more than ${maxBytes} bytes (the limit is ${formatBytes(maxBytes)})`);
  }
  if (xml.trim() === '') return fail('the file is empty');

  const invalid = findInvalidCharacter(xml);
  if (invalid !== null) {
    return fail(`${where(xml, invalid)}: the character ${codePointName(xml.codePointAt(invalid) ?? 0)} is not allowed in XML`);
  }

  const doctype = findOutsideMarkup(xml, /<!DOCTYPE/i);
  if (doctype !== null) {
    return fail(`${where(xml, doctype)}: a DOCTYPE declaration is not accepted (PLCopen files need none; it could declare entities)`);
  }
  const entity = findOutsideMarkup(xml, /<!ENTITY/i);
  if (entity !== null) return fail(`${where(xml, entity)}: an ENTITY declaration is not accepted`);

  const reference = findUndefinedEntity(xml);
  if (reference !== null) {
    const at = where(xml, reference.index);
    if (reference.name === null) return fail(`${at}: a bare "&" must be written &amp;`);
    if (reference.invalidCode !== undefined) {
      return fail(`${at}: the character reference "&${reference.name};" names ${codePointName(reference.invalidCode)}, which is not allowed in XML`);
    }
    return fail(`${at}: the entity reference "&${reference.name};" is not defined in XML`);
  }

  const verdict = XMLValidator.validate(xml, { allowBooleanAttributes: false });
  if (verdict !== true) {
    const { line, col, msg } = verdict.err;
    return fail(`the file is not well-formed XML at line ${line}, column ${col}: ${msg}`);
  }
  return ok(true);
}

/**
 * UTF-8 byte length, counted without TextEncoder so `shared/` needs no platform API; stops
 * counting once past `limit`.
 */
function utf8Length(textValue: string, limit: number): number {
  if (textValue.length > limit) return textValue.length;
  let bytes = 0;
  for (let i = 0; i < textValue.length && bytes <= limit; i += 1) {
    const code = textValue.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff) {
      bytes += 4;
      i += 1;
    } else bytes += 3;
  }
  return bytes;
}

function formatBytes(bytes: number): string {
  if (bytes >= 1_048_576 && bytes % 1_048_576 === 0) return `${bytes / 1_048_576} MB`;
  if (bytes >= 1024 && bytes % 1024 === 0) return `${bytes / 1024} KB`;
  return `${bytes} bytes`;
}

/** `line 3, column 5` of a character index (both 1-based). */
export function where(source: string, index: number): string {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < index; i += 1) {
    if (source.charCodeAt(i) === 10) {
      line += 1;
      lineStart = i + 1;
    }
  }
  return `line ${line}, column ${index - lineStart + 1}`;
}

/** Spans where `<` and `&` are plain characters: comments, CDATA sections, processing instructions. */
const OPAQUE_SPANS: ReadonlyArray<{ open: string; close: string }> = [
  { open: '<!--', close: '-->' },
  { open: '<![CDATA[', close: ']]>' },
  { open: '<?', close: '?>' },
];

/** Index of the first match of `pattern` that is not inside a comment, CDATA or PI, or `null`. */
function findOutsideMarkup(source: string, pattern: RegExp): number | null {
  let found: number | null = null;
  scanOutsideOpaque(source, (segment, offset) => {
    const match = pattern.exec(segment);
    if (match) {
      found = offset + match.index;
      return true;
    }
    return false;
  });
  return found;
}

/**
 * The characters XML 1.0 allows (XML 1.0 Fifth Edition, 2.2 "Characters", production [2] Char):
 * tab, line feed, carriage return, U+0020–U+D7FF, U+E000–U+FFFD, U+10000–U+10FFFF. NUL and the
 * other C0 controls are not among them, in the text or as character references.
 */
function isXmlChar(code: number): boolean {
  return code === 0x9 || code === 0xa || code === 0xd || (code >= 0x20 && code <= 0xd7ff) || (code >= 0xe000 && code <= 0xfffd) || (code >= 0x10000 && code <= 0x10ffff);
}

/** Index of the first character that is not an XML `Char` (an unpaired surrogate counts), or null. */
function findInvalidCharacter(source: string): number | null {
  for (let i = 0; i < source.length; i += 1) {
    const code = source.codePointAt(i)!;
    if (!isXmlChar(code)) return i;
    if (code > 0xffff) i += 1;
  }
  return null;
}

function charRefCode(name: string): number {
  return name.startsWith('#x') ? Number.parseInt(name.slice(2), 16) : Number.parseInt(name.slice(1), 10);
}

/** `U+0000 (NUL)`-style name of a code point for a message. */
function codePointName(code: number): string {
  const hex = `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
  return code === 0 ? `${hex} (NUL)` : hex;
}

/**
 * The first `&` that does not start a predefined entity or a valid character reference (`name`
 * null when unterminated; `invalidCode` set for a reference to a character XML does not allow).
 */
function findUndefinedEntity(source: string): { index: number; name: string | null; invalidCode?: number } | null {
  let found: { index: number; name: string | null; invalidCode?: number } | null = null;
  scanOutsideOpaque(source, (segment, offset) => {
    const pattern = /&([^;\s<&]*);?/g;
    for (let match = pattern.exec(segment); match; match = pattern.exec(segment)) {
      const name = match[1] ?? '';
      const terminated = match[0].endsWith(';');
      const isCharRef = /^#(\d+|x[0-9A-Fa-f]+)$/.test(name);
      if (terminated && isCharRef && !isXmlChar(charRefCode(name))) {
        found = { index: offset + match.index, name, invalidCode: charRefCode(name) };
        return true;
      }
      if (terminated && (PREDEFINED_ENTITIES.has(name) || isCharRef)) continue;
      found = { index: offset + match.index, name: terminated && name !== '' ? name : null };
      return true;
    }
    return false;
  });
  return found;
}

/** Call `visit` with each stretch of text outside comments, CDATA and PIs, until it returns true. */
function scanOutsideOpaque(source: string, visit: (segment: string, offset: number) => boolean): void {
  let position = 0;
  while (position < source.length) {
    let next: { start: number; close: string; open: string } | null = null;
    for (const span of OPAQUE_SPANS) {
      const start = source.indexOf(span.open, position);
      if (start >= 0 && (next === null || start < next.start)) next = { start, close: span.close, open: span.open };
    }
    const end = next === null ? source.length : next.start;
    if (visit(source.slice(position, end), position)) return;
    if (next === null) return;
    const closeAt = source.indexOf(next.close, next.start + next.open.length);
    position = closeAt < 0 ? source.length : closeAt + next.close.length;
  }
}
