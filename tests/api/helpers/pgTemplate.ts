/** In the `api-pg` project: a fresh database for one test file, copied from the run's migrated template. */
import { inject } from 'vitest';
import { copyTemplateDatabase } from './postgresDatabases';

export function freshDatabase(): Promise<{ url: string; drop: () => Promise<void> }> {
  return copyTemplateDatabase(inject('pgAdminUrl'), inject('pgTemplate'));
}
