import { fileURLToPath, URL } from 'node:url';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';

/**
 * Preloads the interface fonts (the woff2 files the app's CSS emits) from the page's head. Without
 * it the browser asks for them only when its first layout meets text set in them, so that layout
 * first loads the system fallback fonts and everything is laid out again when the fonts arrive:
 * 50-100 ms of the workbench's first paint, measured in headless Chromium.
 */
function preloadFonts(): Plugin {
  return {
    name: 'rungwright:preload-fonts',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler: (_html, ctx) =>
        Object.keys(ctx.bundle ?? {})
          .filter((file) => file.endsWith('.woff2'))
          .map((file) => ({ tag: 'link', attrs: { rel: 'preload', as: 'font', type: 'font/woff2', crossorigin: true, href: `/${file}` }, injectTo: 'head' as const })),
    },
  };
}

/**
 * vue-konva's core build (`vue-konva/core`, which leaves the shapes to us) still imports the whole
 * of Konva (`import Konva from 'konva'`) to read one global flag, `autoDrawEnabled`; that import
 * brought every Konva shape, filter and tween (about 200 kB of code, evaluated before the rungs
 * paint). The core module holds the same global, so vue-konva's import is given the core.
 */
function vueKonvaOnCore(): Plugin {
  return {
    name: 'rungwright:vue-konva-on-core',
    enforce: 'pre',
    resolveId(source, importer, options) {
      if (source !== 'konva' || !importer?.includes('/node_modules/vue-konva/')) return null;
      return this.resolve('konva/lib/Core', importer, { ...options, skipSelf: true });
    },
  };
}

const alias = {
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@': fileURLToPath(new URL('./src', import.meta.url)),
};
const apiPort = Number(process.env.API_PORT ?? 3001);

/**
 * The API tests run twice: on PGlite (`api`) and on a PostgreSQL server (`api-pg`), with the
 * PostgreSQL-only tests of `tests/api/postgres/`. `api-pg` needs a cluster, named by
 * RUNGWRIGHT_TEST_DATABASE_URL (`.ci/run` starts a throwaway one and always sets it); without it
 * the project is left out, and says so, so `npm test` still runs on a machine without PostgreSQL.
 */
const testDatabaseUrl = process.env.RUNGWRIGHT_TEST_DATABASE_URL;
/** Files that test the embedded database's own machinery (DATA_DIR lock, PGlite durability, row caches). */
const PGLITE_ONLY = ['tests/api/dataDirLock.test.ts', 'tests/api/dataDirLockRace.test.ts', 'tests/api/serverLockRace.test.ts', 'tests/api/durability.test.ts', 'tests/api/dbCaches.test.ts', 'tests/api/createAdmin.test.ts', 'tests/api/gradingPool.test.ts'];
const apiTest = { environment: 'node' as const, testTimeout: 20_000, hookTimeout: 30_000 };
const apiPgProject = testDatabaseUrl
  ? [
      {
        extends: true as const,
        test: { ...apiTest, name: 'api-pg', include: ['tests/api/**/*.test.ts'], exclude: PGLITE_ONLY, globalSetup: ['tests/api/globalSetupPg.ts'], testTimeout: 120_000 },
      },
    ]
  : [];
if (!testDatabaseUrl && process.env.VITEST) {
  console.warn('vitest: the api-pg project is left out: RUNGWRIGHT_TEST_DATABASE_URL is not set (`.ci/run` starts a PostgreSQL cluster and sets it).');
}

export default defineConfig({
  plugins: [vue(), preloadFonts(), vueKonvaOnCore()],
  resolve: { alias },
  server: {
    port: 5173,
    // changeOrigin stays false: the API server then sees the browser's own `Host: localhost:5173`,
    // a loopback name it answers to, and the same host as the page's Origin, so its Host check and
    // its Origin check (server/http/allowedHosts.ts, security.ts) both pass as in production.
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    chunkSizeWarningLimit: 800,
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: { name: 'reference', include: ['tests/reference/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: { ...apiTest, name: 'api', include: ['tests/api/**/*.test.ts'], exclude: ['tests/api/postgres/**'], globalSetup: ['tests/api/globalSetup.ts'] },
      },
      ...apiPgProject,
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/e2e/globalSetup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
