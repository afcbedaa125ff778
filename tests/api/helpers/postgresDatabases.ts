/** Fresh PostgreSQL databases for the `api-pg` tests, copied from the migrated template. */
import { randomBytes } from 'node:crypto';
import pg from 'pg';

/** `url` with its database name replaced. */
export function databaseUrl(url: string, name: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${name}`;
  return parsed.toString();
}

async function onAdmin<T>(adminUrl: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** A new database copied from `template`; answers its URL and a function that drops it. */
export async function copyTemplateDatabase(adminUrl: string, template: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `rw_test_${randomBytes(6).toString('hex')}`;
  // CREATE DATABASE … TEMPLATE fails while another session is connected to the template; tests never are.
  await onAdmin(adminUrl, (c) => c.query(`create database ${name} template ${template}`));
  return {
    url: databaseUrl(adminUrl, name),
    drop: () => onAdmin(adminUrl, (c) => c.query(`drop database if exists ${name} with (force)`)).then(() => undefined),
  };
}

