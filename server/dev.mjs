// `npm run dev`: the API server under `tsx watch` on API_PORT (default 3001) and the Vite dev
// server, which proxies /api to it (vite.config.ts). Ctrl+C stops both.
import { spawn } from 'node:child_process';

const apiPort = process.env.API_PORT ?? '3001';
const env = { ...process.env, PORT: apiPort, API_PORT: apiPort, NODE_ENV: process.env.NODE_ENV ?? 'development' };
const children = [
  spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'server/index.ts'], { stdio: 'inherit', env }),
  spawn('npx', ['vite'], { stdio: 'inherit', env }),
];

function stopAll(code) {
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  process.exitCode = code;
}
for (const child of children) child.on('exit', (code) => stopAll(code ?? 0));
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));
