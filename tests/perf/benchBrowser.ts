/**
 * The browser the page benchmarks run in, and the client build they measure.
 *
 * Browser: Debian's `chromium-headless-shell`, the build of Chromium made for automation: the same
 * page engine without the browser's own window interface. The full browser in headless mode builds
 * that interface for every new page it opens; a DevTools trace of one workbench load in it showed
 * the hidden omnibox-popup page (a WebUI renderer of its own) using about 220 ms of CPU inside the
 * 660 ms to the first painted rung, on this machine's two cores. That is the browser's cost of
 * opening a window, not the page's, and a student opening the workbench in a tab does not pay it
 * on each navigation. Without the shell, the full Chromium is used with that interface cut down
 * as far as flags allow, and every case names it, so its figures are not mistaken for the shell's.
 *
 * On a shared machine the wall time to the first rung measures the machine as much as the page:
 * with other work keeping the load average at 7-12 on the two cores, the shell's median first
 * render was 1,142-1,410 ms (five runs of five loads) before the changes of issue 18 and
 * 1,007-1,038 ms after, while the page's own main-thread CPU over the same span (the case's
 * `mainThreadCpuMedianMs`) went from 395-528 ms to 334-348 ms. Compare that figure between runs.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { build } from 'vite';
import { chromiumPath, launchChromium } from '../e2e/support/chromium';

export const DEFAULT_HEADLESS_SHELL = '/usr/bin/chromium-headless-shell';

export function headlessShellPath(): string {
  return process.env.CHROMIUM_HEADLESS_SHELL_PATH || DEFAULT_HEADLESS_SHELL;
}

export interface BenchBrowser {
  browser: Browser;
  /** Which build ran, with its version, for every case's `browser` figure. */
  name: string;
}

/**
 * Chromium 156 still builds the omnibox popup with these features off (the trace above was taken
 * with them), but less of the rest: the editor bench's median first render was 550-590 ms with them and
 * 690 ms without, against 270-300 ms in the shell.
 */
const FULL_BROWSER_LESS_UI = ['--disable-features=WebUIOmniboxPopup,PreloadTopChromeWebUI'];

/** The headless shell if it is installed, else the full Chromium (named as such). */
export async function launchBenchBrowser(extraArgs: readonly string[] = []): Promise<BenchBrowser> {
  const shell = headlessShellPath();
  if (existsSync(shell)) {
    const browser = await launchChromium(extraArgs, shell);
    return { browser, name: `chromium-headless-shell ${browser.version()}` };
  }
  const browser = await launchChromium([...extraArgs, ...FULL_BROWSER_LESS_UI], chromiumPath());
  return {
    browser,
    name: `chromium ${browser.version()} (full browser: its window interface shares the CPU; apt-get install -y chromium-headless-shell for the figures the targets refer to)`,
  };
}

/**
 * A fresh production build of the client into `dist/`: a `dist/` that is up to date may still have
 * been built under the e2e runner (NODE_ENV=test), i.e. with Vue's development build, slower and
 * larger than what ships.
 */
export async function buildClientForBench(root = process.cwd()): Promise<void> {
  await build({ root, mode: 'production', logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
}
