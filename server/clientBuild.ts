/**
 * Decides whether the built client in `dist/` is missing or older than its sources, so `npm start`
 * can build it only when needed. Staleness is judged by modification times: the newest file among
 * the client's inputs against `dist/index.html`.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

/** Everything the client bundle is built from, relative to the project root. */
export const CLIENT_INPUTS = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'];

function newestMtime(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

export function clientBuildIsStale(root: string, outDir = 'dist'): boolean {
  const built = path.join(root, outDir, 'index.html');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return CLIENT_INPUTS.some((input) => newestMtime(path.join(root, input)) > builtAt);
}
