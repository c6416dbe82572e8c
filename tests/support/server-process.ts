import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { freePort } from './free-port.ts';

export interface ServerProcess {
  url: string;
  port: number;
  pid: number;
  /** Everything the server wrote, for failure messages. */
  output(): string;
  /** Sends `signal` and waits until the process has exited. */
  kill(signal: NodeJS.Signals): Promise<void>;
}

const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../..');

/**
 * The real server (`server/index.ts`) as a child process on a free port, with `env` (DATABASE_URL,
 * S3_ENDPOINT, SMTP_PORT, BIFOLIO_DATA_DIR…). It runs as `node --import tsx`, one process, so the
 * PID held here is the server's own and SIGKILL ends it with nothing left behind (the `tsx`
 * command would run the server in a child of its own). Resolves once it listens; `port` starts it again where a killed one listened.
 */
export async function spawnServer(env: Record<string, string>, options: { port?: number; timeoutMs?: number } = {}): Promise<ServerProcess> {
  const port = options.port ?? (await freePort());
  const timeoutMs = options.timeoutMs ?? 60_000;
  const url = `http://127.0.0.1:${port}`;
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'test', PORT: String(port), PUBLIC_URL: url, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`The server did not start within ${timeoutMs} ms:\n${output}`)), timeoutMs);
    const onData = () => {
      if (!output.includes('Bifolio API listening')) return;
      clearTimeout(timer);
      child.stdout?.off('data', onData);
      resolve();
    };
    child.stdout?.on('data', onData);
    void exited.then(() => {
      clearTimeout(timer);
      reject(new Error(`The server exited before listening (code ${child.exitCode}):\n${output}`));
    });
  });

  return {
    url,
    port,
    pid: child.pid!,
    output: () => output,
    async kill(signal) {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await exited;
    },
  };
}
