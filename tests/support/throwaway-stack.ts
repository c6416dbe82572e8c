import 'reflect-metadata';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { startFakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { createDataSource } from '@server/data-source.ts';
import { parseEnv, type Env } from '@server/env.ts';
import { startSmtpSink } from '@server/mail/smtp-sink.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { runSeed } from '../../seeds/seed.ts';
import { freePort } from './free-port.ts';
import { startThrowawayCluster } from './pg-cluster.ts';

export interface ThrowawayStack {
  /** The settings of a server on this stack (PORT is a free port kept for it). */
  env: Env;
  /** The same settings as environment variables, for a server started as a child process. */
  variables: Record<string, string>;
  /** A temp folder removed by stop(). */
  tmp: string;
  /** Stops the services and removes the folder; also runs what was added with onStop, first. */
  stop(): Promise<void>;
  /** Adds a cleanup that stop() runs before its own (last added, first run). */
  onStop(cleanup: () => Promise<void>): void;
}

/**
 * Everything a real server needs, on free ports, for one run: a throwaway PostgreSQL cluster,
 * the SMTP sink and the S3 fake (in this process), the migrations and (unless `seed: false`) the demo
 * seed. Used by the browser tests' global setup and by the HTTP and cell-run benchmarks. A failure stops what was started.
 */
export async function startThrowawayStack(options: { database: string; variables?: Record<string, string>; /** Seed the demo group (default true). */ seed?: boolean }): Promise<ThrowawayStack> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), `${options.database.replaceAll('_', '-')}-`));
  const cleanups: (() => Promise<void>)[] = [async () => rmSync(tmp, { recursive: true, force: true })];
  const stop = async () => {
    for (const cleanup of cleanups.splice(0).reverse()) await cleanup().catch((e: Error) => console.error(`[throwaway stack] ${e.message}`));
  };
  try {
    const cluster = await startThrowawayCluster(options.database);
    cleanups.push(cluster.stop);
    const [port, smtpPort, s3Port] = [await freePort(), await freePort(), await freePort()];
    const variables: Record<string, string> = {
      NODE_ENV: 'test',
      PORT: String(port),
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      DATABASE_URL: cluster.databaseUrl,
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      SMTP_PORT: String(smtpPort),
      BIFOLIO_DATA_DIR: tmp,
      ...options.variables,
    };
    const env = parseEnv(variables);
    const sink = await startSmtpSink({ port: smtpPort, directory: env.OUTBOX_DIR });
    cleanups.push(sink.close);
    const s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: env.S3_BUCKET });
    cleanups.push(s3.close);

    const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
    try {
      await dataSource.runMigrations({ transaction: 'each' });
      if (options.seed !== false) {
        const storage = createS3Storage(env);
        await runSeed(dataSource, () => undefined, { publicUrl: env.PUBLIC_URL, storage }).finally(() => storage.client.destroy());
      }
    } finally {
      await dataSource.destroy();
    }
    return { env, variables, tmp, stop, onStop: (cleanup) => cleanups.push(cleanup) };
  } catch (error) {
    await stop();
    throw error;
  }
}
