/**
 * Opens the database: PGlite in DATA_DIR (the default), or a PostgreSQL server through node-postgres
 * when DATABASE_URL is set (`postgres.ts`). Everything else sees a Drizzle `Db` over pg-core.
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
import { createPool, drizzleOnPool, migratePostgres, withSchemaLock } from './postgres';
import { pgliteSerializers } from './jsonbParameter';

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
  | { kind: 'dump'; dump: Blob }
  /** A PostgreSQL server shared with other processes (`DATABASE_URL`). */
  | { kind: 'postgres'; url: string; poolSize?: number; onPoolError?: (err: Error) => void };

/** Which engine a `Database` runs on (`/api/health` reports it). */
export type DatabaseDriver = 'pglite' | 'postgres';

/** An open database: the Drizzle handle plus the driver-specific operations the server needs. */
export interface Database {
  orm: Db;
  /** Reported by `/api/health`; `postgres` means other processes may share the database. */
  driver: DatabaseDriver;
  /** PGlite only: a tar dump of the whole database (tests build one template and copy it per file). */
  dump?: () => Promise<Blob>;
  /**
   * Runs `work` once at a time across every process on this database (first-start seeding): under
   * the PostgreSQL advisory lock of the migrations, or at once on PGlite (DATA_DIR is locked).
   */
  exclusively<T>(work: () => Promise<T>): Promise<T>;
  /** PostgreSQL only: the connection string, for the grading queue (pg-boss keeps a pool of its own). */
  url?: string;
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
  if (source.kind === 'postgres') return openPostgres(source, options);
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
    exclusively: (work) => work(),
    close: () => client.close(),
  };
}

/** A PostgreSQL server: a pool, migrations under the advisory lock, and no row caches. */
async function openPostgres(source: Extract<DatabaseSource, { kind: 'postgres' }>, options: { migrate?: boolean }): Promise<Database> {
  const pool = createPool({ url: source.url, poolSize: source.poolSize, onPoolError: source.onPoolError });
  try {
    if (options.migrate ?? true) await migratePostgres(pool, MIGRATIONS_FOLDER);
    else await pool.query('select 1');
  } catch (err) {
    await pool.end();
    throw err;
  }
  return {
    orm: drizzleOnPool(pool) as unknown as Db,
    driver: 'postgres',
    exclusively: (work) => withSchemaLock(pool, work),
    url: source.url,
    close: () => pool.end(),
  };
}

async function createClient(source: Exclude<DatabaseSource, { kind: 'postgres' }>): Promise<PGlite> {
  switch (source.kind) {
    case 'directory': {
      const dir = pgliteDirectory(source.dataDir);
      // PGlite needs the parent to exist, else ENOENT (STACK.md).
      mkdirSync(path.dirname(dir), { recursive: true });
      return PGlite.create({ dataDir: dir, serializers: pgliteSerializers });
    }
    case 'memory':
      return PGlite.create({ serializers: pgliteSerializers });
    case 'dump':
      return PGlite.create({ loadDataDir: source.dump, serializers: pgliteSerializers });
  }
}
