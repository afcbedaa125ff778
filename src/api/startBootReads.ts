/**
 * Imported first by `main.ts`, so it runs before the rest of the app's modules are evaluated:
 * sends the first page's API reads (see `bootReads.ts`).
 */
import { bootReads } from './bootReads';

bootReads.start(location.pathname);
