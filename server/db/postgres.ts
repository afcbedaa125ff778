/**
 * The PostgreSQL side of `openDatabase` (DATABASE_URL): Drizzle over node-postgres with a pool.
 *
 * Several app processes and workers may start at once on one database, so migrations (and whatever
 * else must run once, like seeding a first start) run under a session-level advisory lock held on a
 * connection of its own: the first process migrates, the others wait on the lock and then find
 * nothing left to do. No row caches here: another process's write would not reach them (measured
 * and explained in DEVELOPERS.md, "Database access and speed").
 */
import pg from 'pg';
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import * as schema from './schema';

/**
 * The advisory lock key of "the schema is being changed or seeded": any fixed bigint; this one
 * spells "rungwr" in ASCII, so it says whose it is in `pg_locks`.
 */
export const SCHEMA_LOCK_KEY = 0x72756e677772n;

/** Connections per process: a save or a sign-in holds one for a few ms; 10 is node-postgres's default. */
export const DEFAULT_POOL_SIZE = 10;

export interface PostgresOptions {
  url: string;
  poolSize?: number;
  /** Tells the pool's idle-client errors (a server restart, a killed backend) to the log. */
  onPoolError?: (err: Error) => void;
}

export function createPool(options: PostgresOptions): pg.Pool {
  const pool = new pg.Pool({ connectionString: options.url, max: options.poolSize ?? DEFAULT_POOL_SIZE });
  // Without a listener an idle client's error (the server went away) would crash the process.
  pool.on('error', (err) => options.onPoolError?.(err));
  return pool;
}

export function drizzleOnPool(pool: pg.Pool) {
  return drizzle({ client: pool, schema });
}

/**
 * Runs `work` while this process holds the schema lock, on a connection kept for the lock alone
 * (a session-level advisory lock belongs to the connection that took it).
 */
export async function withSchemaLock<T>(pool: pg.Pool, work: () => Promise<T>): Promise<T> {
  const lockClient = await pool.connect();
  try {
    await lockClient.query('select pg_advisory_lock($1)', [SCHEMA_LOCK_KEY.toString()]);
    try {
      return await work();
    } finally {
      await lockClient.query('select pg_advisory_unlock($1)', [SCHEMA_LOCK_KEY.toString()]);
    }
  } finally {
    lockClient.release();
  }
}

/** Applies pending migrations from `folder` under the schema lock. */
export async function migratePostgres(pool: pg.Pool, folder: string): Promise<void> {
  await withSchemaLock(pool, () => migrate(drizzle({ client: pool, schema }), { migrationsFolder: folder }));
}
