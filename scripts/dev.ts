import 'reflect-metadata';
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { loadEnvOrExit } from '@server/env.ts';
import { demoBanner } from './demo-banner.ts';
import { prepareLocalStack } from './local-services.ts';

/**
 * `npm run dev`: the same local services, the API under `tsx watch` (restarts on change)
 * and Vite's dev server with hot reload, which proxies /api to the API.
 */
const VITE_PORT = 5173;
const log = (line: string) => console.log(line);
const root = process.cwd();
const publicUrl = process.env.PUBLIC_URL ?? `http://127.0.0.1:${VITE_PORT}`;
const env = loadEnvOrExit({ ...process.env, PUBLIC_URL: publicUrl });

const children: ChildProcess[] = [];
let stopServices: () => Promise<void> = async () => undefined;
let stopping = false;
function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  void stopServices().finally(() => process.exit(code));
}
// `on`, not `once`: a Ctrl-C arrives twice (terminal and tsx's relay); shutdown ignores repeats.
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
  await prepareLocalStack(env, log, (started) => {
    stopServices = started.stop;
  });
  const childEnv = { ...process.env, PUBLIC_URL: publicUrl, PORT: String(env.PORT) };
  const bin = (name: string) => path.join(root, 'node_modules/.bin', name);
  children.push(spawn(bin('tsx'), ['watch', '--clear-screen=false', 'server/index.ts'], { cwd: root, env: childEnv, stdio: 'inherit' }));
  children.push(spawn(bin('vite'), ['--port', String(VITE_PORT), '--strictPort'], { cwd: root, env: childEnv, stdio: 'inherit' }));
  for (const child of children) child.on('exit', (code) => !stopping && shutdown(code ?? 1));
  log(demoBanner(publicUrl, [`API (proxied by Vite): http://127.0.0.1:${env.PORT}/api`]));
} catch (error) {
  console.error(error instanceof Error && error.name !== 'Error' ? `\n${error.message}` : error);
  shutdown(1);
}
