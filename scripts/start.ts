import 'reflect-metadata';
import path from 'node:path';
import { loadEnvOrExit } from '@server/env.ts';
import { startServer } from '@server/index.ts';
import { buildClientIfStale } from './client-build.ts';
import { demoBanner } from './demo-banner.ts';
import { prepareLocalStack } from './local-services.ts';
import { PostgresSetupError } from './postgres/postgres-cluster.ts';

/**
 * `npm start`: local services → migrations → demo seed (once) → client build (when stale)
 * → the app on one origin. Ctrl-C stops everything this process started.
 */
const log = (line: string) => console.log(line);
const env = loadEnvOrExit();
const root = process.cwd();

let stopping = false;
let stopAll: () => Promise<void> = async () => undefined;
const shutdown = (code: number) => {
  if (stopping) return;
  stopping = true;
  log('\nStopping…');
  void stopAll().finally(() => {
    log('Stopped.');
    process.exit(code);
  });
};
// `on`, not `once`: a Ctrl-C reaches this process twice (from the terminal and relayed by tsx),
// and a second default SIGINT would exit before PostgreSQL and the other services are stopped.
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
  const services = await prepareLocalStack(env, log, (started) => {
    stopAll = started.stop;
  });
  const clientDir = path.join(root, 'dist/client');
  buildClientIfStale(root, clientDir, log);
  const server = await startServer(env, { clientDir });
  stopAll = async () => {
    await server.stop();
    await services.stop();
  };
  log(demoBanner(env.PUBLIC_URL));
} catch (error) {
  const known = error instanceof PostgresSetupError || (error as Error).name === 'LocalServiceError';
  console.error(known ? `\n${(error as Error).message}` : error);
  shutdown(1);
}
