/**
 * Imported first by every entry that parses with zod in a browser (`main.ts`, the prover's worker,
 * the bench pages): zod decides, the first time it builds an object schema, whether it may compile
 * a parser with `new Function`, and probes for it; the app's Content Security Policy refuses
 * `new Function`, so the probe made the browser report a violation. Parsing is the same either way.
 *
 * It writes zod's global config without importing zod, so nothing of zod runs ahead of it. The
 * page itself has the same line in `public/zod-jitless.js`, a classic script that runs before any
 * module chunk (a chunk of shared schemas may parse before `main.ts`'s first line); a worker does
 * not run the page's scripts, hence this module.
 */
const scope = globalThis as { __zod_globalConfig?: Record<string, unknown> };
scope.__zod_globalConfig = Object.assign(scope.__zod_globalConfig ?? {}, { jitless: true });

export {};
