/**
 * The `api-pg` project's setup: on the PostgreSQL cluster named by RUNGWRIGHT_TEST_DATABASE_URL
 * (`.ci/run` starts a throwaway one), one migrated template database per run; each test file then
 * gets its own copy (`CREATE DATABASE … TEMPLATE`, tens of ms), dropped when the file ends.
 */
import pg from 'pg';
import type { TestProject } from 'vitest/node';
import { openDatabase } from '../../server/db/client';
import { databaseUrl } from './helpers/postgresDatabases';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The cluster's admin URL (a database to run CREATE DATABASE from); unset in the `api` project. */
    pgAdminUrl: string;
    /** The migrated template database's name. */
    pgTemplate: string;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const adminUrl = process.env.RUNGWRIGHT_TEST_DATABASE_URL;
  if (!adminUrl) throw new Error('RUNGWRIGHT_TEST_DATABASE_URL is not set: the api-pg project needs a PostgreSQL cluster (see .ci/run)');
  const template = `rw_template_${process.pid}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`drop database if exists ${template}`);
  await admin.query(`create database ${template}`);
  const database = await openDatabase({ kind: 'postgres', url: databaseUrl(adminUrl, template), poolSize: 2 });
  await database.close();
  project.provide('pgAdminUrl', adminUrl);
  project.provide('pgTemplate', template);
  return async () => {
    await admin.query(`drop database if exists ${template} with (force)`);
    await admin.end();
  };
}
