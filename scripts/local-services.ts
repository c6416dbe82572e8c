import path from 'node:path';
import type { DataSource } from 'typeorm';
import { startFakeS3, type FakeS3 } from '../fake-s3/start-fake-s3.ts';
import { createDataSource, migrateUnderLock } from '@server/data-source.ts';
import type { Env } from '@server/env.ts';
import { startSmtpSink, type SmtpSink } from '@server/mail/smtp-sink.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { runSeed } from '../seeds/seed.ts';
import { PostgresCluster, describeDatabaseUrl, ensurePostgresBinaries } from './postgres/postgres-cluster.ts';

/**
 * The local services behind `npm start` and `npm run dev`: a private PostgreSQL cluster,
 * the S3 fake and the SMTP sink, each only when its variable points at this machine
 * (point DATABASE_URL, S3_ENDPOINT or SMTP_HOST elsewhere and the real service is used).
 */
type Log = (line: string) => void;

const isLoopback = (host: string) => ['127.0.0.1', 'localhost', '::1', '[::1]'].includes(host);

export class LocalServiceError extends Error {
  override name = 'LocalServiceError';
}

/** Finds or installs the server binaries, creates the cluster on first run, starts it, creates the database. */
export async function ensurePostgres(env: Env, log: Log): Promise<PostgresCluster | null> {
  const db = describeDatabaseUrl(env.DATABASE_URL);
  if (!isLoopback(db.host)) {
    log(`PostgreSQL: using ${db.host}:${db.port}/${db.database} from DATABASE_URL.`);
    return null;
  }
  const binDir = ensurePostgresBinaries(log);
  const cluster = new PostgresCluster(binDir, { root: path.join(env.BIFOLIO_DATA_DIR, 'postgres'), port: db.port });
  if (await cluster.init(db.user, db.password)) log(`PostgreSQL: created a private cluster under ${cluster.layout.root}.`);
  const started = await cluster.start();
  log(`PostgreSQL: ${started ? 'started' : 'already running'} on 127.0.0.1:${db.port}.`);
  if (await cluster.ensureDatabase(db, db.database)) log(`PostgreSQL: created database "${db.database}".`);
  return cluster;
}

/** Runs every pending migration. */
export async function migrate(env: Env, log: Log): Promise<DataSource> {
  const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
  const applied = await migrateUnderLock(dataSource);
  log(applied.length ? `Migrations: applied ${applied.join(', ')}.` : 'Migrations: up to date.');
  return dataSource;
}

function describeListenError(service: string, port: number, error: unknown): LocalServiceError {
  const code = (error as NodeJS.ErrnoException).code;
  return new LocalServiceError(
    code === 'EADDRINUSE'
      ? `${service}: port ${port} on 127.0.0.1 is already in use (is another Bifolio still running?). Stop it, or set a different port.`
      : `${service}: could not start: ${(error as Error).message}`,
  );
}

export interface LocalServices {
  postgres: PostgresCluster | null;
  s3: FakeS3 | null;
  smtp: SmtpSink | null;
  /** Stops what this process started, in reverse order. */
  stop(): Promise<void>;
}

export async function startLocalServices(env: Env, log: Log): Promise<LocalServices> {
  const started: LocalServices = { postgres: null, s3: null, smtp: null, stop: async () => undefined };
  let postgresStartedHere = false;
  started.stop = async () => {
    await started.smtp?.close().catch(() => undefined);
    await started.s3?.close().catch(() => undefined);
    if (postgresStartedHere) await started.postgres?.stop().catch((e: Error) => log(`PostgreSQL: stop failed: ${e.message}`));
  };
  try {
    const wasRunning = isLoopback(describeDatabaseUrl(env.DATABASE_URL).host) && (await alreadyRunning(env));
    started.postgres = await ensurePostgres(env, log);
    postgresStartedHere = started.postgres !== null && !wasRunning;

    const s3 = env.S3_ENDPOINT ? new URL(env.S3_ENDPOINT) : null;
    if (s3 && isLoopback(s3.hostname)) {
      const port = Number(s3.port || 80);
      started.s3 = await startFakeS3({ port, directory: path.join(env.BIFOLIO_DATA_DIR, 's3'), bucket: env.S3_BUCKET }).catch((e: unknown) => {
        throw describeListenError('S3 fake', port, e);
      });
      log(`S3 fake: ${started.s3.endpoint}, bucket "${env.S3_BUCKET}".`);
    }
    if (isLoopback(env.SMTP_HOST)) {
      started.smtp = await startSmtpSink({ port: env.SMTP_PORT, directory: env.OUTBOX_DIR }).catch((e: unknown) => {
        throw describeListenError('SMTP sink', env.SMTP_PORT, e);
      });
      log(`SMTP sink: 127.0.0.1:${env.SMTP_PORT}, messages kept in ${env.OUTBOX_DIR}.`);
    }
    return started;
  } catch (error) {
    await started.stop();
    throw error;
  }
}

async function alreadyRunning(env: Env): Promise<boolean> {
  const cluster = new PostgresCluster(ensurePostgresBinaries(() => undefined), {
    root: path.join(env.BIFOLIO_DATA_DIR, 'postgres'),
    port: describeDatabaseUrl(env.DATABASE_URL).port,
  });
  return cluster.initialized && (await cluster.isRunning());
}

/**
 * What `npm start` and `npm run dev` both do first: start the local services, apply the
 * migrations and seed the demo once. `onStarted` receives the services as soon as they
 * run, so a Ctrl-C during the rest can still stop them; a failure stops them itself.
 */
export async function prepareLocalStack(env: Env, log: Log, onStarted: (services: LocalServices) => void = () => undefined): Promise<LocalServices> {
  const services = await startLocalServices(env, log);
  onStarted(services);
  try {
    const dataSource = await migrate(env, log);
    try {
      const storage = createS3Storage(env);
      await runSeed(dataSource, log, { publicUrl: env.PUBLIC_URL, storage }).finally(() => storage.client.destroy());
    } finally {
      await dataSource.destroy();
    }
    return services;
  } catch (error) {
    await services.stop();
    throw error;
  }
}
