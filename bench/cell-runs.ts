/**
 * Cell runs through the API, one run: `npm run bench` (second part), or `tsx bench/cell-runs.ts`.
 * Starts a throwaway PostgreSQL cluster, the S3 fake and the SMTP sink on free ports, the real
 * server on a free port, signs in, then times RUNS uncached small equilibria runs (each a
 * different parameter value, so none is answered from the store) one after the other over HTTP.
 * The figure is the median time of one run's request, from POST to answer; the engine's own
 * time for such a run is about a millisecond, so the rest is the cost of the run's path
 * (queue, notification, result storage and audit). Goal: median < 100 ms.
 */
import 'reflect-metadata';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { startFakeS3 } from '../fake-s3/start-fake-s3.ts';
import { createDataSource } from '@server/data-source.ts';
import { parseEnv } from '@server/env.ts';
import { startServer } from '@server/index.ts';
import { startSmtpSink } from '@server/mail/smtp-sink.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { createUser } from '@server/services/users/create-user.ts';
import { freePort } from '../tests/support/free-port.ts';
import { startThrowawayCluster } from '../tests/support/pg-cluster.ts';

const RUNS = 20;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-bench-'));
const cluster = await startThrowawayCluster('bifolio_bench');
const [port, smtpPort, s3Port] = [await freePort(), await freePort(), await freePort()];
const env = parseEnv({
  NODE_ENV: 'test',
  PORT: String(port),
  DATABASE_URL: cluster.databaseUrl,
  S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
  SMTP_PORT: String(smtpPort),
  BIFOLIO_DATA_DIR: tmp,
});
const sink = await startSmtpSink({ port: smtpPort, directory: env.OUTBOX_DIR });
const s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: env.S3_BUCKET });
const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
await dataSource.runMigrations({ transaction: 'each' });
const person = { email: 'bench@bench.example', password: 'bench-password-1234' };
const notebookId = await dataSource.transaction(async (manager) => {
  const user = await createUser({ actor: null, manager }, { ...person, name: 'Bench Person', siteRole: 'member', via: 'test' });
  return (await createNotebook({ actor: user, manager }, { title: 'Bench notebook', description: '' })).notebook.id;
});
await dataSource.destroy();
const server = await startServer(env, { sessionPruneSeconds: false });

try {
  const agent = request.agent(`http://127.0.0.1:${server.port}`);
  const csrf = ((await agent.get('/api/auth/csrf')).body as { csrfToken: string }).csrfToken;
  await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send(person).expect(200);
  const entry = await agent.post(`/api/notebooks/${notebookId}/entries`).set('x-csrf-token', csrf).send({ title: 'Bench', entryDate: '2026-12-01' }).expect(201);
  const runUrl = `/api/notebooks/${notebookId}/entries/${(entry.body as { entry: { id: string } }).entry.id}/cells/${crypto.randomUUID()}/run`;
  const body = (mu: number) => ({
    model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: mu }], definitions: [] },
    task: { kind: 'equilibria', box: { x: [-3, 3] }, starts: 8 },
  });
  // Warm-up: the first run loads the engine in a worker thread.
  await agent.post(runUrl).set('x-csrf-token', csrf).send(body(0.5)).expect(200);
  const times: number[] = [];
  const engineTimes: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const started = performance.now();
    const res = await agent.post(runUrl).set('x-csrf-token', csrf).send(body(1 + i / 7)).expect(200);
    times.push(performance.now() - started);
    const output = res.body as { status: string; cached: boolean; elapsedMs: number };
    if (output.status !== 'ok' || output.cached) throw new Error(`run ${i} answered ${JSON.stringify(output).slice(0, 200)}`);
    engineTimes.push(output.elapsedMs);
  }
  const total = times.reduce((a, b) => a + b, 0);
  const ms = median(times);
  console.log(`Bifolio cell runs through the API — Node ${process.version}, ${new Date().toISOString()}`);
  console.log(`${RUNS} uncached small equilibria runs, one after the other: total ${total.toFixed(0)} ms, median ${ms.toFixed(1)} ms per run (engine median ${median(engineTimes).toFixed(1)} ms), slowest ${Math.max(...times).toFixed(1)} ms; goal median < 100 ms: ${ms < 100 ? 'yes' : 'NO'}`);
} finally {
  await server.stop();
  await sink.close();
  await s3.close();
  await cluster.stop();
  rmSync(tmp, { recursive: true, force: true });
}
