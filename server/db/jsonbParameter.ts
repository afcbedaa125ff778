/**
 * How PGlite sends a jsonb parameter: in PostgreSQL's binary jsonb format (one version byte, 1, then
 * the JSON text as UTF-8), not as text. PGlite measures a text parameter's UTF-8 length with a
 * JavaScript loop over its characters, twice, before it encodes it; a byte array it copies. With
 * every save sending a whole document (a 20-rung document is about 9 kB of JSON), the text path was
 * about a tenth of a save's CPU under load (profile of `npm run bench -- http`). The server parses
 * the same text with the same parser either way (`jsonb_recv` hands it to the parser of `jsonb_in`),
 * so what is stored, and every error, stays the same. node-postgres (a PostgreSQL server) sends
 * text as before.
 */
import { types } from '@electric-sql/pglite';

/** Format version of `jsonb_send` / `jsonb_recv` (PostgreSQL's `src/backend/utils/adt/jsonb.c`). */
const JSONB_BINARY_VERSION = 1;

/** JSON text of a parameter value: text as it is (the caller serialised it), anything else as PGlite's own serialiser would. */
function jsonText(value: unknown): string {
  if (typeof value === 'string') return value;
  return JSON.stringify(value, (_key, v: unknown) => (typeof v === 'bigint' ? v.toString() : v));
}

/** A jsonb parameter as the bytes of its binary format. */
export const jsonbParameter = (value: unknown): string => {
  const text = jsonText(value);
  const bytes = Buffer.allocUnsafe(1 + Buffer.byteLength(text, 'utf8'));
  bytes[0] = JSONB_BINARY_VERSION;
  bytes.write(text, 1, 'utf8');
  // PGlite's type says string, but its Bind message takes any byte array as a binary parameter.
  return bytes as unknown as string;
};

/** PGlite's `serializers` option: jsonb parameters go binary. */
export const pgliteSerializers = { [types.JSONB]: jsonbParameter };
