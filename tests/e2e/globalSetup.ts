/**
 * Once per e2e run: fail fast with an install hint when Chromium is missing, and build the client
 * when dist/ is missing or stale, so every test file serves the same fresh build.
 */
import path from 'node:path';
import { build } from 'vite';
import { clientBuildIsStale } from '../../server/clientBuild';
import { missingChromiumHint } from './support/chromium';

export default async function setup(): Promise<void> {
  const hint = missingChromiumHint();
  if (hint) throw new Error(hint);
  const root = process.cwd();
  if (clientBuildIsStale(root)) {
    await build({ root, logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
  }
}
