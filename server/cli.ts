/**
 * `npm run cli -- …`: batch grading and program checks for scripts and CI pipelines.
 * See `server/cli/args.ts` for the usage text.
 */
import { cliMain } from './cli/main';
import { processIO } from './cli/io';

process.exitCode = cliMain(process.argv.slice(2), processIO());
