import 'reflect-metadata';
import { existsSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { closeAnalysisPool } from './analysis/analysis-pool.ts';
import { createApp, type AppOptions } from './app.ts';
import { createDataSource, migrateUnderLock } from './data-source.ts';
import { loadEnvOrExit, type Env } from './env.ts';
import { createSmtpMailer } from './mail/mailer.ts';
import { startAnalysisRunWorker } from './jobs/analysis-run-worker.ts';
import { startMailOutboxWorker } from './jobs/mail-outbox-worker.ts';
import { createS3Storage } from './storage/s3-storage.ts';

export interface RunningServer {
  url: string;
  port: number;
  stop(): Promise<void>;
}

/**
 * Connects to the database, applies pending migrations (under a lock shared by every instance),
 * joins the cell-run queue with ANALYSIS_WORKERS workers, builds the app and listens on
 * 127.0.0.1:PORT (or `host`). Every piece of state several instances share is in PostgreSQL.
 */
export async function startServer(env: Env, options: AppOptions & { host?: string } = {}): Promise<RunningServer> {
  const dataSource = createDataSource(env.DATABASE_URL);
  await dataSource.initialize();
  await migrateUnderLock(dataSource);
  const runQueue = await startAnalysisRunWorker(env, dataSource);
  const mailer = createSmtpMailer(env);
  const storage = createS3Storage(env);
  const bifolio = createApp({ env, dataSource, mailer, storage, runQueue }, options);
  const outbox = startMailOutboxWorker(dataSource, mailer);
  const server: Server = await new Promise((resolve, reject) => {
    const s = bifolio.app.listen(env.PORT, options.host ?? '127.0.0.1', (error?: Error) => (error ? reject(error) : resolve(s)));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : env.PORT;
  return {
    url: env.PUBLIC_URL,
    port,
    async stop() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await bifolio.close();
      await outbox.stop();
      await runQueue.stop();
      await closeAnalysisPool();
      mailer.close();
      storage.client.destroy();
      await dataSource.destroy();
    },
  };
}

const isEntryPoint = process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname);
if (isEntryPoint) {
  const env = loadEnvOrExit();
  const clientDir = path.resolve('dist/client');
  const running = await startServer(env, { clientDir: existsSync(clientDir) ? clientDir : null, host: process.env.HOST });
  process.stdout.write(`Bifolio API listening on 127.0.0.1:${running.port} (${env.PUBLIC_URL}), instance ${env.INSTANCE_NAME}, ${env.ANALYSIS_WORKERS} analysis worker(s)\n`);
  // A signal may arrive twice (a terminal's Ctrl-C and tsx's relay of it): stop once, ignore repeats.
  let stopping = false;
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      void running.stop().then(() => process.exit(0));
    });
  }
}
