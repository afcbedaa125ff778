/**
 * Finds and launches Debian's Chromium for the browser suite. `CHROMIUM_PATH` overrides the
 * default `/usr/bin/chromium`. No browser is ever downloaded: when none is found, the suite fails
 * with a one-line install hint rather than skipping.
 */
import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

export const DEFAULT_CHROMIUM = '/usr/bin/chromium';

export function chromiumPath(): string {
  return process.env.CHROMIUM_PATH || DEFAULT_CHROMIUM;
}

export function missingChromiumHint(): string | null {
  const executable = chromiumPath();
  if (existsSync(executable)) return null;
  return `Chromium not found at ${executable}: install it with "apt-get install -y chromium" or set CHROMIUM_PATH.`;
}

// The background-networking flags keep Chromium from calling out of this closed machine; as root
// the sandbox must be off. playwright-core gives every launch a fresh profile of its own.
const LAUNCH_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/**
 * Launch Chromium with the flags above, plus `extraArgs` (e.g. a benchmark's uncapped frame rate);
 * `executablePath` names another Chromium build (the benchmarks' headless shell).
 */
export async function launchChromium(extraArgs: readonly string[] = [], executablePath = chromiumPath()): Promise<Browser> {
  if (!existsSync(executablePath)) throw new Error(missingChromiumHint() ?? `Chromium not found at ${executablePath}`);
  return chromium.launch({ executablePath, args: [...LAUNCH_ARGS, ...extraArgs] });
}
