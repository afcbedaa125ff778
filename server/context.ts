/** What every router and service receives: the app's dependencies, passed in, never global. */
import type { Logger } from 'pino';
import type { Config } from './config';
import type { Clock } from './clock';
import type { DatabaseDriver, Db } from './db/client';
import type { Mailer } from './mail/mailer';
import type { ScryptParams } from './auth/passwords';
import type { DocumentWork, Grader } from './grading/pool';
import type { JobQueue } from './jobs/jobQueue';

export interface AppContext {
  orm: Db;
  driver: DatabaseDriver;
  mailer: Mailer;
  clock: Clock;
  config: Config;
  logger: Logger;
  version: string;
  sessionKey: Uint8Array;
  /** Cost of new password hashes (tests lower it; stored hashes carry their own). */
  passwordParams: ScryptParams;
  /** Grades submissions off the main thread (the worker pool of `grading/pool.ts`). */
  grader: Grader;
  /** Exports and imports program files off the main thread (the same pool). */
  documents: DocumentWork;
  /** A tar of the whole database (PGlite's dump of its data directory) for the admin's backup; null where the database is elsewhere. */
  backup: (() => Promise<Blob>) | null;
  /**
   * On a shared PostgreSQL database: submissions are graded by `npm run worker` processes from this
   * queue instead of in this process (regrades stay in this process's pool: the instructor waits
   * for their count). Absent on PGlite.
   */
  jobQueue?: JobQueue;
}
