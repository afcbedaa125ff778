/**
 * Opens the database. The only file that knows the database is PGlite: everything else sees a
 * Drizzle `Db` over pg-core, so a node-postgres client can slot in here when DATABASE_URL is set.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import type { SQL } from 'drizzle-orm';
import * as schema from './schema';
import { enableRowCaches } from './rowCache';

/** The Drizzle handle every db-layer function takes; driver-agnostic on purpose. */
export type Db = PgDatabase<PgQueryResultHKT, typeof schema>;

/**
 * The rows of a raw SQL statement, as the driver returns them (column names as in SQL). Both PGlite
 * and node-postgres answer `{ rows }`; this is the one place that relies on it.
 */
export async function executeRows<Row extends Record<string, unknown>>(db: Db, query: SQL): Promise<Row[]> {
  const result = (await db.execute(query)) as unknown as { rows: Row[] };
  return result.rows;
}

/** Where the data comes from: a directory on disk, a fresh in-memory database, or a dump to copy. */
export type DatabaseSource =
  | { kind: 'directory'; dataDir: string }
  | { kind: 'memory' }
  | { kind: 'dump'; dump: Blob };

/** An open database: the Drizzle handle plus the driver-specific operations the server needs. */
export interface Database {
  orm: Db;
  /** Reported by `/api/health`. */
  driver: 'pglite';
  /** A tar dump of the whole database (tests build one template and copy it per file). */
  dump(): Promise<Blob>;
  close(): Promise<void>;
}

/** The migrations drizzle-kit wrote, next to this file. */
export const MIGRATIONS_FOLDER = fileURLToPath(new URL('./migrations', import.meta.url));

/** The PGlite directory inside DATA_DIR (DATA_DIR also holds the lock file and the signing key). */
export function pgliteDirectory(dataDir: string): string {
  return path.join(path.resolve(dataDir), 'pgdata');
}

/**
 * Opens the database and, unless told otherwise, applies pending migrations (drizzle-kit must
 * never migrate beside a running server: PGlite has no lock of its own).
 */
export async function openDatabase(source: DatabaseSource, options: { migrate?: boolean } = {}): Promise<Database> {
  const client = await createClient(source);
  const db = drizzle({ client, schema }) as unknown as Db;
  if (options.migrate ?? true) {
    await migrate(drizzle({ client, schema }), { migrationsFolder: MIGRATIONS_FOLDER });
  }
  // PGlite runs inside this process and DATA_DIR is locked to it: no other writer can exist.
  enableRowCaches(db);
  return {
    orm: db,
    driver: 'pglite',
    dump: () => client.dumpDataDir('none'),
    close: () => client.close(),
  };
}

async function createClient(source: DatabaseSource): Promise<PGlite> {
  switch (source.kind) {
    case 'directory': {
      const dir = pgliteDirectory(source.dataDir);
      // PGlite needs the parent to exist, else ENOENT (STACK.md).
      mkdirSync(path.dirname(dir), { recursive: true });
      return PGlite.create({ dataDir: dir });
    }
    case 'memory':
      return PGlite.create();
    case 'dump':
      return PGlite.create({ loadDataDir: source.dump });
  }
}
