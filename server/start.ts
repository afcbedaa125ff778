/**
 * `npm start`: build the client when the build is missing or stale, then start the server, which
 * serves the API and the built single-page app from one port.
 */
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { clientBuildIsStale } from './clientBuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

if (clientBuildIsStale(root)) {
  console.log('Rungwright: building the client (dist/ is missing or older than its sources)…');
  const { build } = await import('vite');
  await build({ root, logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
}

await import('./index');
