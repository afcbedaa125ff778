/**
 * The worker's first import: the page's classic `zod-jitless.js` does not run in a worker, and
 * without this zod probes for `new Function` the first time it parses, which the Content Security
 * Policy refuses (a `script-src eval` violation reported in the worker; seen in this bench before
 * this file existed). No import here, so it runs before any module that loads zod.
 */
const scope = globalThis as unknown as { __zod_globalConfig?: Record<string, unknown> };
scope.__zod_globalConfig = Object.assign(scope.__zod_globalConfig ?? {}, { jitless: true });
