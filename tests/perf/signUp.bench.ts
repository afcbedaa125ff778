/**
 * Sign-up answer time for an address with an account and one without, against the real server
 * process on loopback (PGlite on a temporary DATA_DIR). Requests go one at a time, the two kinds
 * alternating (which comes first swaps every round) with a pause after each, so the mail that each
 * sign-up sends after answering is not timed in the next answer. The answer must not tell the two
 * apart: the figures to compare are the medians and their ratio (`existingOverNew`), near 1.
 */
import { rmSync } from 'node:fs';
import type { BenchCase } from './run';
import { median, percentile, round } from './stats';
import { DEMO_CLASS, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess } from '../api/helpers/serverProcess';

const ROUNDS = Number(process.env.BENCH_SIGN_UP_ROUNDS ?? 200);
/** Long enough for the previous sign-up's mail (a lookup, a token, the local SMTP round) to finish. */
const PAUSE_MS = 150;

export default async function (): Promise<BenchCase[]> {
  const dataDir = makeTempDataDir();
  const server = await startServerProcess(dataDir, { LOG_LEVEL: 'warn', AUTH_RATE_LIMIT: '1000000' });
  const pause = () => new Promise((r) => setTimeout(r, PAUSE_MS));
  const ask = async (email: string): Promise<number> => {
    const started = performance.now();
    const res = await fetch(`${server.url}/api/auth/sign-up`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: server.url },
      body: JSON.stringify({ email, name: 'Bench', joinCode: DEMO_CLASS.joinCode }),
    });
    await res.text();
    if (res.status !== 202) throw new Error(`sign-up answered ${res.status}`);
    return performance.now() - started;
  };
  try {
    for (let i = 0; i < 20; i += 1) await ask(`warm.${i}@larch-hollow.example`);
    await pause();
    const existing: number[] = [];
    const fresh: number[] = [];
    for (let i = 0; i < ROUNDS; i += 1) {
      const order = i % 2 === 0 ? (['existing', 'fresh'] as const) : (['fresh', 'existing'] as const);
      for (const kind of order) {
        if (kind === 'existing') existing.push(await ask(DEMO_STUDENTS[0]!.email));
        else fresh.push(await ask(`new.${i}@larch-hollow.example`));
        await pause();
      }
    }
    return [
      {
        case: 'sign-up answer, address with and without an account',
        rounds: ROUNDS,
        existingMedianMs: round(median(existing), 2),
        newMedianMs: round(median(fresh), 2),
        existingP90Ms: round(percentile(existing, 90), 2),
        newP90Ms: round(percentile(fresh, 90), 2),
        existingOverNew: round(median(existing) / median(fresh), 3),
      },
    ];
  } finally {
    server.child.kill('SIGTERM');
    await server.exited;
    rmSync(dataDir, { recursive: true, force: true });
  }
}
