/** The product version, from package.json (reported by `/api/health`). */
import { readFileSync } from 'node:fs';

export function readVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version?: string };
  return pkg.version ?? '0.0.0';
}
