/**
 * Checks on every request body and query before a route sees them, for input no route may get:
 *
 * - JSON nested deeper than `MAX_JSON_DEPTH`, refused from the raw bytes before `JSON.parse` (which
 *   spent ~0.5 s on a 1 MB body of brackets) and before zod, `JSON.stringify` or the database,
 *   which recurse per level. The program document's own, lower limit (`DOCUMENT_LIMITS`) is
 *   checked where documents are read, with the rung named.
 * - The NUL character (U+0000) in any string or field name: PostgreSQL refuses it in `text` and
 *   `jsonb`, so it is refused here with the field named instead of failing at the database.
 */
import type { RequestHandler } from 'express';
import { ApiError } from './failure';
import { sendFailure } from './errorHandler';

/**
 * Arrays and objects inside one another. A program document nested to its limit of 32 levels of
 * branches is about 70 levels of JSON inside a request; 128 leaves room and refuses the absurd.
 */
export const MAX_JSON_DEPTH = 128;

const OPEN_BRACE = 0x7b;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACE = 0x7d;
const CLOSE_BRACKET = 0x5d;
const QUOTE = 0x22;
const BACKSLASH = 0x5c;

/**
 * The byte offset where `json` first nests deeper than `limit`, or -1. Brackets inside strings do
 * not count; the text need not be valid JSON (the parser says so afterwards).
 */
export function depthExceededAt(json: Uint8Array, limit: number): number {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < json.length; i += 1) {
    const byte = json[i];
    if (inString) {
      if (byte === BACKSLASH) i += 1;
      else if (byte === QUOTE) inString = false;
    } else if (byte === QUOTE) inString = true;
    else if (byte === OPEN_BRACE || byte === OPEN_BRACKET) {
      depth += 1;
      if (depth > limit) return i;
    } else if (byte === CLOSE_BRACE || byte === CLOSE_BRACKET) depth -= 1;
  }
  return -1;
}

/** `verify` hook of `express.json`: runs on the raw (already inflated) body before it is parsed. */
export function refuseDeepJson(_req: unknown, _res: unknown, body: Buffer): void {
  const at = depthExceededAt(body, MAX_JSON_DEPTH);
  if (at >= 0) {
    throw new ApiError({
      code: 'validation',
      message: `The request body nests arrays and objects more than ${MAX_JSON_DEPTH} levels deep (at byte ${at}); nothing was read`,
      fields: { '(body)': `nested more than ${MAX_JSON_DEPTH} levels deep` },
    });
  }
}

/**
 * Whether any string or key in `root` holds U+0000, walked without recursion and without building
 * a path per value: a save's document has about a thousand values, and the paths (a string and an
 * object each) cost more than the check. The path is built only once a NUL is known to be there.
 */
function holdsNulCharacter(root: unknown): boolean {
  const stack: unknown[] = [root];
  while (stack.length > 0) {
    const value = stack.pop();
    if (typeof value === 'string') {
      if (value.includes('\u0000')) return true;
    } else if (Array.isArray(value)) {
      for (const item of value) stack.push(item);
    } else if (value !== null && typeof value === 'object') {
      for (const key of Object.keys(value)) {
        if (key.includes('\u0000')) return true;
        stack.push((value as Record<string, unknown>)[key]);
      }
    }
  }
  return false;
}

/** The dotted path of the first string or key holding U+0000 in `root`, walked without recursion. */
export function findNulCharacter(root: unknown): string | null {
  if (!holdsNulCharacter(root)) return null;
  const stack: { value: unknown; path: string }[] = [{ value: root, path: '' }];
  const join = (path: string, key: string | number): string => (path === '' ? String(key) : `${path}.${key}`);
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    if (typeof value === 'string') {
      if (value.includes('\u0000')) return path || '(body)';
    } else if (Array.isArray(value)) {
      value.forEach((item, i) => stack.push({ value: item, path: join(path, i) }));
    } else if (value !== null && typeof value === 'object') {
      for (const [key, item] of Object.entries(value)) {
        if (key.includes('\u0000')) return path || '(body)';
        stack.push({ value: item, path: join(path, key) });
      }
    }
  }
  return null;
}

/** 400 naming the field when the query or the parsed body holds U+0000 anywhere. */
export const refuseNulCharacters: RequestHandler = (req, res, next) => {
  for (const [part, value] of [['query', req.query], ['body', req.body]] as const) {
    const field = findNulCharacter(value);
    if (field !== null) {
      sendFailure(res, {
        code: 'validation',
        message: `${field}: the NUL character (U+0000) is not accepted in text`,
        fields: { [field]: `holds the NUL character (U+0000)${part === 'query' ? ' (in the query string)' : ''}` },
      });
      return;
    }
  }
  next();
};
