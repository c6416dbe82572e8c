import 'reflect-metadata';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import type { RunQueue, RunWaitLimits } from '@server/analysis/run-queue.ts';
import { inject } from 'vitest';
import { startFakeS3, type FakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { createApp, type AppOptions, type BifolioApp } from '@server/app.ts';
import { createDataSource } from '@server/data-source.ts';
import { parseEnv, type Env } from '@server/env.ts';
import { startAnalysisRunWorker } from '@server/jobs/analysis-run-worker.ts';
import { createSmtpMailer, type Mailer } from '@server/mail/mailer.ts';
import { startSmtpSink, type SmtpSink } from '@server/mail/smtp-sink.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { freePort } from './free-port.ts';

export { makeNotebook, makeUser, uniqueEmail, type TestPerson } from './factories.ts';

export const TEST_PUBLIC_URL = 'http://127.0.0.1:4800';

export interface TestApp {
  app: BifolioApp['app'];
  dataSource: DataSource;
  env: Env;
  /** The SMTP sink now running (or the last one, once stopped). */
  readonly sink: SmtpSink;
  mailer: Mailer;
  /** Stops the SMTP sink, as when the mail relay goes down (delivered mail stays in OUTBOX_DIR). */
  stopMail(): Promise<void>;
  /** Starts the SMTP sink again on the same port. */
  startMail(): Promise<void>;
  /** Stops the S3 fake (its objects stay on disk), as when file storage goes down. */
  stopStorage(): Promise<void>;
  /** Starts the S3 fake again on the same port with the same objects. */
  startStorage(): Promise<void>;
  runQueue: RunQueue;
  /** The next message to `to` that arrives after `since` (ms since epoch). */
  waitForMail(to: string, since?: number, timeoutMs?: number): Promise<ParsedMail>;
  close(): Promise<void>;
}

/**
 * The real app against the run's test database, with an in-process SMTP sink and S3 fake
 * on free ports, and the cell-run queue with this process's analysis workers. Its rate-limit
 * counters are its own (a fresh namespace), as if it were the only server. One per test file
 * (beforeAll/afterAll).
 */
export async function createTestApp(
  options: AppOptions & { mailer?: Mailer; env?: Record<string, string>; runWait?: Partial<RunWaitLimits>; runSweepIntervalMs?: number } = {},
): Promise<TestApp> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-app-'));
  const [smtpPort, s3Port] = [await freePort(), await freePort()];
  const env = parseEnv({
    NODE_ENV: 'test',
    DATABASE_URL: inject('databaseUrl'),
    PUBLIC_URL: TEST_PUBLIC_URL,
    S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
    SMTP_PORT: String(smtpPort),
    BIFOLIO_DATA_DIR: tmp,
    ...options.env,
  });
  let sink = await startSmtpSink({ port: smtpPort, directory: env.OUTBOX_DIR });
  let mailRunning = true;
  const startS3 = () => startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: env.S3_BUCKET });
  let s3: FakeS3 | null = await startS3();
  const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 4 }).initialize();
  const mailer = options.mailer ?? createSmtpMailer(env);
  const storage = createS3Storage(env);
  const runQueue = await startAnalysisRunWorker(env, dataSource, { wait: options.runWait, sweepIntervalMs: options.runSweepIntervalMs });
  const bifolio = createApp(
    { env, dataSource, mailer, storage, runQueue },
    { sessionPruneSeconds: false, ...options, rateLimits: { namespace: `test-${randomUUID()}`, ...options.rateLimits } },
  );

  async function waitForMail(to: string, since = 0, timeoutMs = 10_000): Promise<ParsedMail> {
    const deadline = Date.now() + timeoutMs;
    const seen = new Set<string>();
    while (Date.now() < deadline) {
      for (const file of readdirSync(env.OUTBOX_DIR).sort()) {
        if (seen.has(file)) continue;
        seen.add(file);
        const full = path.join(env.OUTBOX_DIR, file);
        const mail = await simpleParser(readFileSync(full));
        const recipients = [mail.to].flat().flatMap((a) => a?.value.map((v) => v.address) ?? []);
        if (recipients.includes(to) && (mail.date?.getTime() ?? Date.now()) >= since - 1000) return mail;
      }
      await new Promise((r) => setTimeout(r, 50));
    }
    throw new Error(`No mail to ${to} arrived within ${timeoutMs} ms`);
  }

  return {
    app: bifolio.app,
    dataSource,
    env,
    get sink() {
      return sink;
    },
    mailer,
    runQueue,
    waitForMail,
    async stopMail() {
      if (mailRunning) await sink.close();
      mailRunning = false;
    },
    async startMail() {
      if (!mailRunning) sink = await startSmtpSink({ port: smtpPort, directory: env.OUTBOX_DIR });
      mailRunning = true;
    },
    async stopStorage() {
      await s3?.close();
      s3 = null;
    },
    async startStorage() {
      s3 ??= await startS3();
    },
    async close() {
      await bifolio.close();
      await runQueue.stop();
      mailer.close();
      storage.client.destroy();
      await dataSource.destroy();
      if (mailRunning) await sink.close();
      await s3?.close();
      rmSync(tmp, { recursive: true, force: true });
    },
  };
}

export type Agent = ReturnType<typeof request.agent>;

/** What supertest can talk to: the app in this process, or the address of a running server. */
export type AgentTarget = TestApp['app'] | string;

/** A cookie-keeping client with the session's CSRF token. */
export async function newAgent(app: AgentTarget): Promise<{ agent: Agent; csrf: string }> {
  const agent = request.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  return { agent, csrf: res.body.csrfToken as string };
}

/** Signs in (fetching the CSRF token first) and returns the agent and token for later writes. */
export async function signIn(app: AgentTarget, person: { email: string; password: string }): Promise<{ agent: Agent; csrf: string }> {
  const { agent, csrf } = await newAgent(app);
  const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: person.email, password: person.password });
  if (res.status !== 200) throw new Error(`sign-in as ${person.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, csrf };
}
