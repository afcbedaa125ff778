/**
 * Imported by `main.ts` before any module that builds a zod schema. zod decides when it builds an
 * object schema whether it may compile a parser with `new Function`, probing for it the first time;
 * the app's Content Security Policy refuses `new Function`, so the probe only made the browser
 * report a CSP violation while the first page was loading. Parsing is the same either way.
 */
import { config } from 'zod';

config({ jitless: true });
