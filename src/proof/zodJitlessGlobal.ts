/**
 * The worker's first import: zod is told not to probe for `new Function` (refused by the app's
 * Content Security Policy) before any module that builds a schema is evaluated. The same setting
 * as `public/zod-jitless.js` for the page, written to zod's global config without importing zod,
 * so nothing of zod runs ahead of it.
 */
const scope = globalThis as { __zod_globalConfig?: Record<string, unknown> };
scope.__zod_globalConfig = Object.assign(scope.__zod_globalConfig ?? {}, { jitless: true });

export {};
