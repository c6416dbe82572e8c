import 'reflect-metadata';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startFakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { createDataSource } from '@server/data-source.ts';
import { parseEnv } from '@server/env.ts';
import { startServer } from '@server/index.ts';
import { startSmtpSink } from '@server/mail/smtp-sink.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { runSeed } from '../../seeds/seed.ts';
import { freePort } from './free-port.ts';
import { startThrowawayCluster } from './pg-cluster.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    outboxDir: string;
  }
}

/**
 * Browser tests: a throwaway cluster, S3 fake and SMTP sink on free ports, migrations and
 * the demo seed, a fresh client build, and the real server serving it on one origin.
 */
export default async function setup(project: TestProject) {
  const root = path.resolve(fileDir(), '../..');
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-e2e-'));
  const cleanups: (() => Promise<void>)[] = [async () => rmSync(tmp, { recursive: true, force: true })];
  const teardown = async () => {
    for (const cleanup of cleanups.reverse()) await cleanup().catch((e: Error) => console.error(`[e2e teardown] ${e.message}`));
  };
  try {
    const cluster = await startThrowawayCluster('bifolio_e2e');
    cleanups.push(cluster.stop);
    const [port, smtpPort, s3Port] = [await freePort(), await freePort(), await freePort()];
    const env = parseEnv({
      NODE_ENV: 'test',
      PORT: String(port),
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      DATABASE_URL: cluster.databaseUrl,
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      SMTP_PORT: String(smtpPort),
      BIFOLIO_DATA_DIR: tmp,
    });
    const sink = await startSmtpSink({ port: smtpPort, directory: env.OUTBOX_DIR });
    cleanups.push(sink.close);
    const s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: env.S3_BUCKET });
    cleanups.push(s3.close);

    const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
    await dataSource.runMigrations({ transaction: 'each' });
    const storage = createS3Storage(env);
    await runSeed(dataSource, () => undefined, { publicUrl: env.PUBLIC_URL, storage }).finally(() => storage.client.destroy());
    await dataSource.destroy();

    const clientDir = path.join(tmp, 'client');
    execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', clientDir, '--emptyOutDir', '--logLevel', 'error'], { cwd: root, stdio: 'inherit' });

    const server = await startServer(env, { clientDir, sessionPruneSeconds: false });
    cleanups.push(server.stop);
    project.provide('baseUrl', env.PUBLIC_URL);
    project.provide('outboxDir', env.OUTBOX_DIR);
  } catch (error) {
    await teardown();
    throw error;
  }
  return teardown;
}

function fileDir(): string {
  return path.dirname(new URL(import.meta.url).pathname);
}
