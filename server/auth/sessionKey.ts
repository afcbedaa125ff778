/**
 * The key that signs session tokens: JWT_SECRET when set, else 32 random bytes generated once into
 * DATA_DIR/session.key (mode 0600), so sessions survive a restart.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Config } from '../config';

export const SESSION_KEY_FILE = 'session.key';

export function loadSessionKey(config: Config): Uint8Array {
  if (config.JWT_SECRET) return new TextEncoder().encode(config.JWT_SECRET);
  const dir = path.resolve(config.DATA_DIR);
  const file = path.join(dir, SESSION_KEY_FILE);
  try {
    return Buffer.from(readFileSync(file, 'utf8').trim(), 'hex');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
  }
  mkdirSync(dir, { recursive: true });
  const key = randomBytes(32);
  writeFileSync(file, key.toString('hex'), { mode: 0o600, flag: 'wx' });
  return key;
}
