/**
 * `npm run db:reset`: wipes the database in DATA_DIR and seeds the demo data again, or, with
 * DEMO=off, leaves it empty for `create-admin` (a reset must not bring back demo sign-ins with
 * published passwords on a real install). Takes the DATA_DIR lock first, so it refuses while a
 * server is running on that directory.
 */
import { rmSync } from 'node:fs';
import { readConfig } from '../config';
import { systemClock } from '../clock';
import { acquireDataDirLock } from '../dataDirLock';
import { openDatabase, pgliteDirectory } from './client';
import { seedDemoData } from './seed';
import { DEMO_ACCOUNTS } from './demoAccounts';

const configResult = readConfig(process.env);
if (!configResult.ok) {
  console.error(configResult.error);
  process.exit(1);
}
const { DATA_DIR, DATABASE_URL, DEMO } = configResult.config;
if (DATABASE_URL) {
  // A shared database is never wiped by a convenience script: that is the database owner's call.
  console.error('Not resetting: DATABASE_URL is set. db:reset wipes only the embedded database in DATA_DIR; unset DATABASE_URL (or drop and recreate the PostgreSQL database yourself).');
  process.exit(1);
}
const lock = acquireDataDirLock(DATA_DIR, systemClock.now(), 'command');
if (!lock.ok) {
  console.error(`Not resetting: ${lock.error}`);
  process.exit(1);
}
try {
  rmSync(pgliteDirectory(DATA_DIR), { recursive: true, force: true });
  const database = await openDatabase({ kind: 'directory', dataDir: DATA_DIR });
  if (DEMO === 'on') await seedDemoData(database.orm, systemClock);
  await database.close();
  if (DEMO === 'on') {
    console.log(`Reset the database in ${pgliteDirectory(DATA_DIR)} and seeded the demo data. Demo sign-ins:`);
    for (const a of DEMO_ACCOUNTS) console.log(`  ${a.role.padEnd(10)} ${a.email}  /  ${a.password}`);
  } else {
    console.log(`Reset the database in ${pgliteDirectory(DATA_DIR)}; it has no accounts (DEMO=off). Create the first admin with \`npm run cli -- create-admin --email you@example.org\`.`);
  }
} catch (err) {
  console.error(`Reset failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  lock.lock.release();
}
