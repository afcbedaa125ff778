/**
 * The malformed requests of the fuzz test (`fuzz.test.ts`), as fast-check arbitraries: for one
 * route, a path with its parameters filled by real ids or junk (bad `%`-escapes, huge numbers,
 * long text), a junk query, and a body that is wrong in one of many ways (shape, type, NUL, huge
 * integers, deep nesting, content type, content encoding, multipart, XML).
 */
import { gzipSync } from 'node:zlib';
import fc from 'fast-check';

/** A request as plain data; `fuzz.test.ts` sends it with supertest. */
export interface FuzzRequest {
  method: string;
  path: string;
  query: string;
  /** Index into the callers (roles, the stranger). */
  who: number;
  body: FuzzBody;
}

export type FuzzBody =
  | { kind: 'none' }
  | { kind: 'json'; label: string; value: unknown }
  | { kind: 'raw'; label: string; contentType: string | null; encoding?: string; bytes: Buffer }
  | { kind: 'multipart'; label: string; contentType: string; bytes: Buffer };

/** Real ids to put in paths, by parameter, so requests reach the code behind the id check. */
export type IdPool = Record<string, readonly string[]>;

// ── Values ──────────────────────────────────────────────────────────────────────────────────────

/** Path segments that are not valid `%`-encoding or are odd in other ways. */
const BAD_SEGMENTS = [
  '%', '%%', '%2', '%zz', '%E0%A4%A', '%C0%80', '%FF%FE', '%ED%A0%80', '%u0041', '%00', 'a%00b', '%2F', '..', '%2E%2E',
  '0', '-1', '1.5', '2147483647', '2147483648', '9007199254740993', '99999999999999999999999', '1e400', 'NaN', 'Infinity', '0x10',
  'null', 'undefined', '%20', '%0A', '%EF%BF%BF', '%F4%90%80%80',
];

const HUGE_NUMBERS = [2 ** 31, 2 ** 31 - 1, -(2 ** 31) - 1, 2 ** 53 + 2, 1e300, -1e300, 1.5, -1, 0, Number.MAX_VALUE, Number.MIN_VALUE];

/** Values that break a field: wrong type, NUL, out of range, deep, long. */
export const junkValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(...HUGE_NUMBERS),
  fc.constantFrom('', ' ', '\u0000', 'a\u0000b', '\uFFFF', '\uD800', '=HYPERLINK("x")', '../../etc/passwd', '%E0%A4%A', 'x'.repeat(5000), null, true, false, [], {}),
  fc.string({ maxLength: 40 }).map((s) => `${s}\u0000`),
  fc.string({ unit: 'binary', maxLength: 20 }),
  fc.integer(),
  fc.double(),
  fc.uuid(),
  fc.integer({ min: 20, max: 400 }).map((depth) => nested(depth, 'array')),
  fc.jsonValue({ maxDepth: 3 }),
);

/** `depth` arrays (or objects, or program branches) inside one another. */
export function nested(depth: number, kind: 'array' | 'object' | 'branch'): unknown {
  let value: unknown = kind === 'branch' ? { kind: 'contact', id: 'c', variant: 'no', operand: '%IX1' } : 0;
  for (let i = 0; i < depth; i += 1) {
    if (kind === 'array') value = [value];
    else if (kind === 'object') value = { a: value };
    else value = i % 2 === 0 ? { kind: 'parallel', id: `p${i}`, branches: [value] } : { kind: 'series', id: `s${i}`, items: [value] };
  }
  return value;
}

/** A program document that is wrong in a way the limits or the schema must catch. */
const badDocument: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: 33, max: 3000 }).map((depth) => ({ format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', network: { kind: 'series', id: 'n', items: [nested(depth, 'branch')] } }] })),
  fc.constant({ format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', comment: 'a\u0000b', network: { kind: 'series', id: 'n', items: [] } }] }),
  fc.constant({ format: 'rungwright.program', version: 2 ** 31, rungs: [] }),
  fc.constant({ format: 'rungwright.program', version: 1, rungs: [{ id: 'r1', network: { kind: 'series', id: 'n', items: Array.from({ length: 600 }, (_, i) => ({ kind: 'contact', id: `c${i}`, variant: 'no', operand: '%IX1' })) } }] }),
  junkValue,
);

// ── Paths and queries ───────────────────────────────────────────────────────────────────────────

function encodeSafely(text: string): string {
  try {
    return encodeURIComponent(text);
  } catch {
    return 'x';
  }
}

function segment(candidates: readonly string[]): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: candidates.length > 0 ? 4 : 0, arbitrary: candidates.length > 0 ? fc.constantFrom(...candidates) : fc.constant('x') },
    { weight: 1, arbitrary: fc.uuid() },
    { weight: 3, arbitrary: fc.constantFrom(...BAD_SEGMENTS) },
    { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 30 }).map(encodeSafely) },
    { weight: 1, arbitrary: fc.constant('x'.repeat(3000)) },
  );
}

/** The pool key of a path parameter: `:id` after `/programs` is a program id, and so on. */
function poolKey(pattern: string[], index: number): string {
  const name = pattern[index]!.slice(1);
  return name === 'id' ? `${pattern[index - 1]}:id` : name;
}

function pathFor(pattern: string, ids: IdPool): fc.Arbitrary<string> {
  const parts = pattern.split('/');
  return fc.tuple(...parts.map((part, i) => (part.startsWith(':') ? segment(ids[poolKey(parts, i)] ?? []) : fc.constant(part)))).map((filled) => filled.join('/'));
}

const QUERY_KEYS = ['format', 'from', 'to', 'ownerId', 'status', 'late', 'student', 'latest', 'sort', 'order', 'x', 'from[]', 'a[b]', '__proto__'];
const query: fc.Arbitrary<string> = fc.oneof(
  { weight: 3, arbitrary: fc.constant('') },
  {
    weight: 2,
    arbitrary: fc
      .array(fc.tuple(fc.constantFrom(...QUERY_KEYS), fc.oneof(fc.constantFrom(...BAD_SEGMENTS, 'json', 'plcopen', 'xml', 'true'), fc.string({ maxLength: 12 }).map(encodeSafely))), { maxLength: 4 })
      .map((pairs) => pairs.map(([k, v]) => `${k}=${v}`).join('&')),
  },
);

// ── Bodies ──────────────────────────────────────────────────────────────────────────────────────

/** A valid body for a route, to be spoiled one field at a time; see `VALID_BODIES` in the test. */
export type BodyTemplate = Record<string, unknown>;

function spoil(template: BodyTemplate): fc.Arbitrary<FuzzBody> {
  const keys = Object.keys(template);
  const replaced = keys.length === 0
    ? fc.record({ extra: junkValue }).map((value) => ({ kind: 'json' as const, label: 'unknown field', value }))
    : fc.tuple(fc.constantFrom(...keys), fc.oneof(junkValue, badDocument)).map(([key, value]) => ({ kind: 'json' as const, label: `${key} spoiled`, value: { ...template, [key]: value } }));
  return fc.oneof(
    { weight: 6, arbitrary: replaced },
    { weight: 1, arbitrary: fc.constant({ kind: 'json' as const, label: 'valid', value: template }) },
    { weight: 1, arbitrary: keys.length > 0 ? fc.constantFrom(...keys).map((key) => ({ kind: 'json' as const, label: `${key} missing`, value: Object.fromEntries(Object.entries(template).filter(([k]) => k !== key)) })) : fc.constant({ kind: 'none' as const }) },
    { weight: 1, arbitrary: fc.constant({ kind: 'json' as const, label: 'extra field', value: { ...template, unexpected: 1 } }) },
  );
}

const raw = (label: string, contentType: string | null, bytes: Buffer | string, encoding?: string): FuzzBody => ({ kind: 'raw', label, contentType, bytes: Buffer.from(bytes), ...(encoding ? { encoding } : {}) });

const rawBodies: fc.Arbitrary<FuzzBody> = fc.oneof(
  fc.constantFrom(
    raw('bad JSON', 'application/json', '{"a":'),
    raw('bad JSON', 'application/json', '[1,2'),
    raw('bad JSON', 'application/json', 'undefined'),
    raw('bad JSON', 'application/json', '{"a":"\u0000"}'),
    raw('NUL escape in JSON', 'application/json', '{"title":"a\\u0000b","name":"\\u0000","email":"\\u0000@x.example"}'),
    raw('NUL key in JSON', 'application/json', '{"a\\u0000":1}'),
    raw('huge integer in JSON', 'application/json', '{"baseVersion":99999999999999999999,"version":1e400,"score":-1e400}'),
    raw('bad charset', 'application/json; charset=utf-99', '{}'),
    raw('latin1 charset', 'application/json; charset=iso-8859-1', '{"title":"\xe9"}'),
    raw('text body', 'text/plain', 'hello'),
    raw('form body', 'application/x-www-form-urlencoded', 'a=1&b=%zz'),
    raw('XML body', 'application/xml', '<a>\u0000</a>'),
    raw('no content type', null, '{"a":1}'),
    raw('invalid gzip', 'application/json', 'not gzip at all', 'gzip'),
    raw('invalid deflate', 'application/json', 'not deflate', 'deflate'),
    raw('invalid brotli', 'application/json', 'not brotli', 'br'),
    raw('unknown encoding', 'application/json', '{}', 'compress'),
    raw('truncated gzip', 'application/json', gzipSync(Buffer.from('{"title":"x"}')).subarray(0, 12), 'gzip'),
    raw('valid gzip', 'application/json', gzipSync(Buffer.from('{"title":"gzipped"}')), 'gzip'),
    raw('gzip of deep JSON', 'application/json', gzipSync(Buffer.from(`${'['.repeat(100_000)}${']'.repeat(100_000)}`)), 'gzip'),
    raw('deep JSON text', 'application/json', `${'['.repeat(200_000)}${']'.repeat(200_000)}`),
    raw('deep JSON in a string', 'application/json', `{"title":"${'['.repeat(1000)}"}`),
  ),
  fc.integer({ min: 100, max: 20_000 }).map((depth) => ({ kind: 'json' as const, label: 'deep JSON', value: { title: 'x', document: nested(depth, 'object') } })),
  fc.jsonValue({ maxDepth: 4 }).map((value) => ({ kind: 'json' as const, label: 'any JSON', value })),
);

// ── Multipart ───────────────────────────────────────────────────────────────────────────────────

const BOUNDARY = 'fuzzboundary7MA4YWxkTrZu0gW';

function multipartBody(parts: { name: string; filename?: string; type?: string; content: Buffer | string }[], boundary = BOUNDARY): Buffer {
  const chunks: Buffer[] = [];
  for (const part of parts) {
    const disposition = `form-data; name="${part.name}"${part.filename !== undefined ? `; filename="${part.filename}"` : ''}`;
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: ${disposition}\r\n${part.type ? `Content-Type: ${part.type}\r\n` : ''}\r\n`));
    chunks.push(Buffer.from(part.content));
    chunks.push(Buffer.from('\r\n'));
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return Buffer.concat(chunks);
}

const withBoundary = `multipart/form-data; boundary=${BOUNDARY}`;
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(32)]);
const XML_HEAD = '<?xml version="1.0" encoding="UTF-8"?><project xmlns="http://www.plcopen.org/xml/tc6_0201">';

const multipartBodies: fc.Arbitrary<FuzzBody> = fc.constantFrom<FuzzBody>(
  { kind: 'multipart', label: 'multipart without boundary', contentType: 'multipart/form-data', bytes: multipartBody([{ name: 'file', filename: 'a.xml', content: '<a/>' }]) },
  { kind: 'multipart', label: 'multipart with empty boundary', contentType: 'multipart/form-data; boundary=', bytes: Buffer.from('--\r\n') },
  { kind: 'multipart', label: 'multipart garbage', contentType: withBoundary, bytes: Buffer.from('this is not multipart') },
  { kind: 'multipart', label: 'multipart truncated', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'a.xml', content: '<a/>' }]).subarray(0, 60) },
  { kind: 'multipart', label: 'multipart bad header', contentType: withBoundary, bytes: Buffer.from(`--${BOUNDARY}\r\nContent-Disposition\r\n\r\nx\r\n--${BOUNDARY}--\r\n`) },
  { kind: 'multipart', label: 'multipart no file', contentType: withBoundary, bytes: multipartBody([{ name: 'other', content: 'x' }]) },
  { kind: 'multipart', label: 'multipart wrong field', contentType: withBoundary, bytes: multipartBody([{ name: 'upload', filename: 'a.xml', type: 'application/xml', content: '<a/>' }]) },
  { kind: 'multipart', label: 'multipart two files', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'a.xml', type: 'application/xml', content: '<a/>' }, { name: 'file', filename: 'b.xml', type: 'application/xml', content: '<b/>' }]) },
  { kind: 'multipart', label: 'multipart NUL file name', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'a\u0000.png', type: 'image/png', content: PNG }]) },
  { kind: 'multipart', label: 'multipart NUL file name (RFC 5987)', contentType: withBoundary, bytes: Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename*=UTF-8''a%00b.csv\r\nContent-Type: text/csv\r\n\r\nemail,name\r\n--${BOUNDARY}--\r\n`) },
  { kind: 'multipart', label: 'XML with NUL', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'p.xml', type: 'application/xml', content: `${XML_HEAD}\u0000</project>` }]) },
  { kind: 'multipart', label: 'XML with &#0;', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'p.xml', type: 'application/xml', content: `${XML_HEAD}<x a="&#0;"/></project>` }]) },
  { kind: 'multipart', label: 'XML with DTD', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'p.xml', type: 'application/xml', content: '<!DOCTYPE a [<!ENTITY b "c">]><a>&b;</a>' }]) },
  { kind: 'multipart', label: 'XML deeply nested', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'p.xml', type: 'application/xml', content: `${'<a>'.repeat(50_000)}${'</a>'.repeat(50_000)}` }]) },
  { kind: 'multipart', label: 'XML not XML', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'p.xml', type: 'application/xml', content: '\u00ff\u00fe garbage' }]) },
  { kind: 'multipart', label: 'CSV with NUL', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'r.csv', type: 'text/csv', content: 'email,name\r\na\u0000@x.example,\u0000Ana\r\n' }]) },
  { kind: 'multipart', label: 'CSV formulas', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'r.csv', type: 'text/csv', content: 'email,name\r\nf@x.example,=HYPERLINK("x")\r\n' }]) },
  { kind: 'multipart', label: 'CSV not CSV', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'r.csv', type: 'text/csv', content: '"unterminated\r\n\u0001\u0002' }]) },
  { kind: 'multipart', label: 'PNG attachment', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'w.png', type: 'image/png', content: PNG }]) },
  { kind: 'multipart', label: 'attachment not an image', contentType: withBoundary, bytes: multipartBody([{ name: 'file', filename: 'w.png', type: 'image/png', content: 'not a png' }]) },
  { kind: 'multipart', label: 'multipart gzip-encoded', contentType: withBoundary, bytes: gzipSync(multipartBody([{ name: 'file', filename: 'a.xml', content: '<a/>' }])) },
);

// ── Requests ────────────────────────────────────────────────────────────────────────────────────

const OTHER_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'];

/**
 * Requests to `route` from any of `callers` callers: bodies spoil `template` (a valid JSON body) or
 * are wrong wholesale; an upload route (`template` "multipart") gets mostly multipart bodies.
 */
export function requestsFor(route: { method: string; path: string }, template: BodyTemplate | 'multipart' | null, ids: IdPool, callers: number): fc.Arbitrary<FuzzRequest> {
  const takesBody = route.method !== 'GET' && route.method !== 'DELETE';
  const body: fc.Arbitrary<FuzzBody> = template === 'multipart'
    ? fc.oneof({ weight: 6, arbitrary: multipartBodies }, { weight: 1, arbitrary: rawBodies }, { weight: 1, arbitrary: fc.constant({ kind: 'none' as const }) })
    : takesBody
    ? fc.oneof(
        { weight: 5, arbitrary: template ? spoil(template) : rawBodies },
        { weight: 3, arbitrary: rawBodies },
        { weight: 2, arbitrary: multipartBodies },
        { weight: 1, arbitrary: fc.constant({ kind: 'none' as const }) },
      )
    : fc.oneof({ weight: 6, arbitrary: fc.constant({ kind: 'none' as const }) }, { weight: 1, arbitrary: rawBodies });
  const method = fc.oneof({ weight: 9, arbitrary: fc.constant(route.method) }, { weight: 1, arbitrary: fc.constantFrom(...OTHER_METHODS) });
  return fc.record({ method, path: pathFor(route.path, ids), query, who: fc.nat({ max: callers - 1 }), body });
}
