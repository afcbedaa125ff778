/**
 * One contender in the DATA_DIR lock race: a separate Node process running the real lock code
 * (`node --import tsx tests/api/helpers/lockContender.ts`, driven over IPC). It loads the module
 * once, then for each trial spins until the wall-clock instant the test gives and only then calls
 * `acquireDataDirLock`, so two contenders reach the lock within a fraction of a millisecond of each
 * other, which spawning two processes alone never achieves.
 */
import { acquireDataDirLock, type DataDirLock } from '../../../server/dataDirLock';

/** What the test sends. */
export type ContenderCommand = { type: 'try'; dir: string; at: number } | { type: 'release' } | { type: 'exit' };

/** What a contender answers. */
export type ContenderReply =
  | { type: 'ready'; pid: number }
  | { type: 'result'; won: boolean; error: string | null; lateByMs: number }
  | { type: 'released' };

const send = (reply: ContenderReply) => process.send?.(reply);

let held: DataDirLock | null = null;

process.on('message', (command: ContenderCommand) => {
  if (command.type === 'try') {
    // Busy-wait rather than a timer: a timer fires up to a few ms late, and differently in each process.
    while (Date.now() < command.at) {
      // spin
    }
    const lateByMs = Date.now() - command.at;
    const result = acquireDataDirLock(command.dir, new Date());
    if (result.ok) held = result.lock;
    send({ type: 'result', won: result.ok, error: result.ok ? null : result.error, lateByMs });
  } else if (command.type === 'release') {
    held?.release();
    held = null;
    send({ type: 'released' });
  } else {
    process.exit(0);
  }
});

send({ type: 'ready', pid: process.pid });
