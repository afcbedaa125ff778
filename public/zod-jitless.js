// Runs before every module of the app (a classic script, not deferred): zod reads its settings from
// this global when its first module is evaluated, and a chunk of shared schemas may parse the
// built-in panel layout before main.ts's own first line could call zod's `config`. Without it, zod
// probes for `new Function`, which the Content Security Policy refuses, and the browser reports a
// violation. The same setting as src/api/zodJitless.ts, which workers import first.
globalThis.__zod_globalConfig = Object.assign(globalThis.__zod_globalConfig || {}, { jitless: true });
