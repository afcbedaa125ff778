/** The PostgreSQL settings of `server/config.ts`: what DATABASE_URL requires and refuses. */
import { describe, expect, it } from 'vitest';
import { readConfig } from '../../../server/config';

const SECRET = 'a-secret-of-at-least-thirty-two-characters';

describe('DATABASE_URL', () => {
  it('is optional: without it the server runs on PGlite in DATA_DIR', () => {
    const result = readConfig({});
    expect(result.ok && result.config.DATABASE_URL).toBeUndefined();
  });

  it('takes a postgres:// or postgresql:// URL with the pool and queue defaults', () => {
    for (const url of ['postgres://u:p@db.internal:5432/rw', 'postgresql://db/rw']) {
      const result = readConfig({ DATABASE_URL: url, JWT_SECRET: SECRET });
      expect(result).toMatchObject({ ok: true, config: { DATABASE_URL: url, DATABASE_POOL_SIZE: 10, GRADING_JOB_EXPIRE_SECONDS: 60, GRADING_QUEUE_CHECK_SECONDS: 15 } });
    }
  });

  it('refuses another kind of URL, naming the variable', () => {
    const result = readConfig({ DATABASE_URL: 'mysql://db/rw', JWT_SECRET: SECRET });
    expect(result).toEqual({ ok: false, error: 'Bad environment: DATABASE_URL must be a postgres:// or postgresql:// URL' });
  });

  it('requires JWT_SECRET, since every process must check the others\u2019 sessions', () => {
    const result = readConfig({ DATABASE_URL: 'postgres://db/rw' });
    expect(result.ok).toBe(false);
    expect(!result.ok && result.error).toContain('JWT_SECRET must be set');
  });

  it('refuses a pool size or job expiry out of range', () => {
    expect(readConfig({ DATABASE_URL: 'postgres://db/rw', JWT_SECRET: SECRET, DATABASE_POOL_SIZE: '0' }).ok).toBe(false);
    expect(readConfig({ DATABASE_URL: 'postgres://db/rw', JWT_SECRET: SECRET, GRADING_JOB_EXPIRE_SECONDS: 'soon' }).ok).toBe(false);
  });
});
