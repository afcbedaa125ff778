/**
 * jsonb parameters (server/db/jsonbParameter.ts): on PGlite they travel in the binary jsonb format,
 * on PostgreSQL as text; either way the database stores the same value and refuses the same input
 * with the same SQLSTATE as a jsonb literal in the statement would.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { executeRows, type Database } from '../../server/db/client';
import { openTemplateDatabase } from './helpers/testApp';

let database: Database;
beforeAll(async () => {
  database = await openTemplateDatabase();
});
afterAll(() => database.close());

/** A literal as PostgreSQL reads it with standard_conforming_strings on (test-only; the app never builds SQL text). */
const literal = (text: string) => sql.raw(`'${text.replaceAll("'", "''")}'`);

/** The SQLSTATE a statement fails with (Drizzle wraps the driver's error in `cause`). */
async function sqlState(run: () => Promise<unknown>): Promise<string | undefined> {
  try {
    await run();
  } catch (err) {
    for (let e: unknown = err; e && typeof e === 'object'; e = (e as { cause?: unknown }).cause) {
      const code = (e as { code?: unknown }).code;
      if (typeof code === 'string') return code;
    }
    return 'no SQLSTATE';
  }
  return undefined;
}

const DOCUMENT = {
  title: 'Zuführband «Nord» — 北 conveyor 🚚',
  quote: 'it\'s "quoted" \\ back\\slash',
  controls: 'tab\there\nnew line \u0001',
  numbers: [0, -1.5, 1e21, 123456789012345],
  nested: { empty: {}, none: null, yes: true, list: [[], [{}]] },
};

describe('jsonb parameters', () => {
  it('store the value a jsonb literal of the same text stores, non-ASCII and escapes included', async () => {
    const text = JSON.stringify(DOCUMENT);
    const [row] = await executeRows<{ same: boolean; back: unknown; stored: string }>(
      database.orm,
      sql`select ${text}::jsonb = ${literal(text)}::jsonb as same, ${text}::jsonb as back, (${text}::jsonb)::text as stored`,
    );
    expect(row!.same).toBe(true);
    expect(row!.back).toEqual(DOCUMENT);
    expect(JSON.parse(row!.stored)).toEqual(DOCUMENT);
  });

  it('take an object as PGlite and node-postgres serialise it', async () => {
    const [row] = await executeRows<{ back: unknown }>(database.orm, sql`select ${sql.param(DOCUMENT)}::jsonb as back`);
    expect(row!.back).toEqual(DOCUMENT);
  });

  it('refuse text that is not JSON, and U+0000, with the SQLSTATE a literal gets', async () => {
    for (const bad of ['{"a":', 'not json', '{"a":"\\u0000"}']) {
      const asParameter = await sqlState(() => executeRows(database.orm, sql`select ${bad}::jsonb as v`));
      const asLiteral = await sqlState(() => executeRows(database.orm, sql`select ${literal(bad)}::jsonb as v`));
      expect(asParameter).toBeDefined();
      expect([bad, asParameter]).toEqual([bad, asLiteral]);
    }
  });
});
