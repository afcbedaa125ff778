/**
 * What every browser test file opens first: the real server on a fresh data directory and one
 * Chromium, started before the file's tests and stopped after them, and the screenshots folder
 * (git-ignored; look at what the tests write there). Call at the top of a file; the two are
 * ready inside tests and later hooks.
 */
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchChromium } from './chromium';
import { startServer, type RunningServer } from './server';

export const SHOTS = 'tests/e2e/screenshots';

export interface BrowserSuite {
  server: RunningServer;
  browser: Browser;
}

export function useBrowserSuite(): BrowserSuite {
  const suite = {} as BrowserSuite;
  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    suite.server = await startServer();
    suite.browser = await launchChromium();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await suite.server?.stop();
  });
  return suite;
}
