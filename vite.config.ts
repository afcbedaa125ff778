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
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/api/globalSetup.ts'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
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
