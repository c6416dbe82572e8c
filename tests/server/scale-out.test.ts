import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { runCellResponseSchema, runProgressSchema, type RunCellResponse } from '@shared/api/entries.ts';
import type { EquilibriaResult } from '@shared/engine/contract.ts';
import { createDataSource } from '@server/data-source.ts';
import { startSmtpSink, type SmtpSink } from '@server/mail/smtp-sink.ts';
import { startFakeS3, type FakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { freePort } from '../support/free-port.ts';
import { spawnServer, type ServerProcess } from '../support/server-process.ts';
import { makeNotebook, makeUser, type TestPerson } from '../support/test-app.ts';
import { RUNAWAY_REQUEST } from './entries-support.ts';

/**
 * Two real server processes (`tsx server/index.ts`) against one database and one bucket, as
 * behind a load balancer without sticky sessions: instance A only queues runs
 * (ANALYSIS_WORKERS=0), instance B has one analysis worker. Sessions, runs, cancels and rate-limit
 * counts are shared through PostgreSQL.
 */

const SIGN_IN_FAILURE_LIMIT = 4;

type Instance = ServerProcess;

const startInstance = (name: string, env: Record<string, string>): Promise<Instance> => spawnServer({ ...env, INSTANCE_NAME: name });

/** SIGTERM (the server stops itself cleanly), and waits for the process to end. */
const stopInstance = async (instance: Instance | undefined): Promise<void> => instance?.kill('SIGTERM');

/** A browser's view of the site: one cookie and one CSRF token, whichever instance answers. */
class Browser {
  private cookie = '';
  private csrf = '';

  async call(instance: Instance, method: string, url: string, body?: unknown, signal?: AbortSignal): Promise<{ status: number; body: unknown }> {
    const res = await fetch(`${instance.url}${url}`, {
      method,
      headers: {
        ...(this.cookie ? { cookie: this.cookie } : {}),
        ...(this.csrf ? { 'x-csrf-token': this.csrf } : {}),
        ...(body !== undefined ? { 'content-type': 'application/json' } : {}),
      },
      body: body !== undefined ? JSON.stringify(body) : undefined,
      signal,
    });
    const setCookie = res.headers.getSetCookie().find((c) => c.startsWith('bifolio.sid='));
    if (setCookie) this.cookie = setCookie.split(';')[0];
    const text = await res.text();
    return { status: res.status, body: text ? (JSON.parse(text) as unknown) : null };
  }

  async begin(instance: Instance): Promise<void> {
    this.csrf = ((await this.call(instance, 'GET', '/api/auth/csrf')).body as { csrfToken: string }).csrfToken;
  }
}

describe('several server instances on one database and one bucket', () => {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-scale-'));
  let dataSource: DataSource;
  let sink: SmtpSink;
  let s3: FakeS3;
  let a: Instance;
  let b: Instance;
  let person: TestPerson;
  let notebookId: string;

  beforeAll(async () => {
    const databaseUrl = inject('databaseUrl');
    dataSource = await createDataSource(databaseUrl, { poolSize: 2 }).initialize();
    const [smtpPort, s3Port] = [await freePort(), await freePort()];
    sink = await startSmtpSink({ port: smtpPort, directory: path.join(tmp, 'mail') });
    s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: 'bifolio' });
    const shared = {
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      PUBLIC_URL: 'http://127.0.0.1:4800',
      SESSION_SECRET: 'several-instances-share-this-session-secret',
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      S3_BUCKET: 'bifolio',
      SMTP_PORT: String(smtpPort),
      BIFOLIO_DATA_DIR: tmp,
      SIGN_IN_FAILURE_LIMIT: String(SIGN_IN_FAILURE_LIMIT),
    };
    // Started together: both take the migration lock and join the queue at the same time.
    [a, b] = await Promise.all([startInstance('instance-a', { ...shared, ANALYSIS_WORKERS: '0' }), startInstance('instance-b', { ...shared, ANALYSIS_WORKERS: '1' })]);
    person = await makeUser(dataSource, { label: 'scale' });
    notebookId = (await makeNotebook(dataSource, person.user)).id;
  }, 120_000);

  afterAll(async () => {
    await Promise.all([stopInstance(a), stopInstance(b)]);
    await dataSource?.destroy();
    await sink?.close();
    await s3?.close();
    rmSync(tmp, { recursive: true, force: true });
  }, 60_000);

  it('keeps a session made on one instance valid on the other, and a sign-out on either ends it (ASVS V3.3.1)', async () => {
    const browser = new Browser();
    await browser.begin(a);
    expect((await browser.call(a, 'POST', '/api/auth/sign-in', { email: person.email, password: person.password })).status).toBe(200);
    const onB = await browser.call(b, 'GET', '/api/auth/me');
    expect(onB.status).toBe(200);
    expect(onB.body).toMatchObject({ user: { email: person.email } });
    expect((await browser.call(b, 'POST', '/api/auth/sign-out')).status).toBeLessThan(300);
    expect((await browser.call(a, 'GET', '/api/auth/me')).status).toBe(401);
  });

  it('runs a cell requested through the queue-only instance on the worker instance, and answers with its result', async () => {
    const browser = new Browser();
    await browser.begin(a);
    await browser.call(a, 'POST', '/api/auth/sign-in', { email: person.email, password: person.password });
    const entry = await browser.call(a, 'POST', `/api/notebooks/${notebookId}/entries`, { title: 'Across instances', entryDate: '2026-12-01' });
    expect(entry.status).toBe(201);
    const entryId = (entry.body as { entry: { id: string } }).entry.id;
    const runUrl = (cellId: string) => `/api/notebooks/${notebookId}/entries/${entryId}/cells/${cellId}/run`;

    // x' = μ − x² with μ = 2.25 has its equilibria at x = ±1.5.
    const cellId = crypto.randomUUID();
    const request = {
      model: { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 2.25 }], definitions: [] },
      task: { kind: 'equilibria', box: { x: [-3, 3] }, starts: 8 },
    };
    const res = await browser.call(a, 'POST', runUrl(cellId), request);
    expect(res.status).toBe(200);
    const output = runCellResponseSchema.parse(res.body);
    expect(output).toMatchObject({ status: 'ok', cached: false });
    const states = (output.result as EquilibriaResult).equilibria.map((e) => e.state.x).sort((p, q) => p - q);
    expect(states[0]).toBeCloseTo(-1.5, 8);
    expect(states[states.length - 1]).toBeCloseTo(1.5, 8);
    const rows = (await dataSource.query(`SELECT status, instance FROM analysis_run WHERE cell_id = $1`, [cellId])) as { status: string; instance: string }[];
    expect(rows).toEqual([{ status: 'finished', instance: 'instance-b' }]);
    const events = (await dataSource.query(`SELECT 1 FROM audit_event WHERE action = 'cell.run' AND entity_id = $1`, [cellId])) as unknown[];
    expect(events).toHaveLength(1);

    // A long run on B, watched through A and cancelled through A.
    const longCell = crypto.randomUUID();
    const pending = browser.call(a, 'POST', runUrl(longCell), { ...RUNAWAY_REQUEST, timeLimitMs: 60_000 });
    let state = 'idle';
    for (let i = 0; i < 200 && state !== 'running'; i += 1) {
      await new Promise((r) => setTimeout(r, 50));
      state = runProgressSchema.parse((await browser.call(a, 'GET', runUrl(longCell))).body).state;
    }
    expect(state).toBe('running');
    const [running] = (await dataSource.query(`SELECT instance FROM analysis_run WHERE cell_id = $1`, [longCell])) as { instance: string }[];
    expect(running.instance).toBe('instance-b');
    expect((await browser.call(a, 'DELETE', runUrl(longCell))).status).toBe(204);
    const answer = (await pending).body as RunCellResponse;
    expect(answer).toMatchObject({ status: 'error', error: { code: 'run_cancelled' } });
    expect(runProgressSchema.parse((await browser.call(b, 'GET', runUrl(longCell))).body).state).toBe('idle');

    // B's only worker is free again: the next run goes through (it would wait a minute otherwise).
    const next = await browser.call(a, 'POST', runUrl(cellId), { ...request, model: { ...request.model, parameters: [{ name: 'mu', value: 4 }] } });
    expect(runCellResponseSchema.parse(next.body)).toMatchObject({ status: 'ok', cached: false });
    const cancelled = (await dataSource.query(`SELECT status FROM analysis_run WHERE cell_id = $1`, [longCell])) as { status: string }[];
    expect(cancelled).toEqual([{ status: 'cancelled' }]);
    expect((await dataSource.query(`SELECT 1 FROM audit_event WHERE action = 'cell.run' AND entity_id = $1`, [longCell])) as unknown[]).toHaveLength(0);
  }, 60_000);

  it('computes the reproducibility rerun of an approval made through the queue-only instance on the worker instance', async () => {
    const researcher = await makeUser(dataSource, { label: 'scale-researcher' });
    const pi = await makeUser(dataSource, { label: 'scale-pi' });
    const reviewed = (await makeNotebook(dataSource, pi.user, [{ user: researcher.user, role: 'researcher' }])).id;
    const [writer, signer] = [new Browser(), new Browser()];
    for (const [browser, who] of [[writer, researcher], [signer, pi]] as const) {
      await browser.begin(a);
      expect((await browser.call(a, 'POST', '/api/auth/sign-in', { email: who.email, password: who.password })).status).toBe(200);
    }
    const created = await writer.call(a, 'POST', `/api/notebooks/${reviewed}/entries`, { title: 'Signed across instances', entryDate: '2026-12-02' });
    const { entry, head } = created.body as { entry: { id: string }; head: { id: string } };
    const entryUrl = `/api/notebooks/${reviewed}/entries/${entry.id}`;

    // x' = μ − x² with μ = 6.25: equilibria at x = ±2.5, computed on B for the researcher.
    const [modelCell, cell] = [crypto.randomUUID(), crypto.randomUUID()];
    const model = { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 6.25 }], definitions: [] };
    const task = { kind: 'equilibria', box: { x: [-4, 4] }, starts: 8 };
    const run = runCellResponseSchema.parse((await writer.call(a, 'POST', `${entryUrl}/cells/${cell}/run`, { model, task })).body);
    expect(run.status).toBe('ok');
    const document = {
      type: 'doc',
      content: [
        { type: 'cell', attrs: { id: modelCell, kind: 'model', input: { name: 'Saddle-node', ...model } } },
        { type: 'cell', attrs: { id: cell, kind: 'equilibria', input: { modelCellId: modelCell, task } } },
      ],
    };
    const revision = await writer.call(a, 'POST', `${entryUrl}/revisions`, {
      baseRevisionId: head.id, title: 'Signed across instances', entryDate: '2026-12-02', tags: [], document, outputs: { [cell]: run },
    });
    expect(revision.status).toBe(201);
    const revisionId = (revision.body as { id: string }).id;
    expect((await writer.call(a, 'POST', `${entryUrl}/review`, { revisionId })).status).toBe(201);

    const approved = await signer.call(a, 'POST', `${entryUrl}/review/approve`, { revisionId, password: pi.password });
    expect(approved.status).toBe(200);
    const [signature] = (approved.body as { signatures: { reproducibility: { status: string; cells: { cellId: string; status: string }[] } }[] }).signatures;
    expect(signature.reproducibility.status).toBe('reproduced');
    expect(signature.reproducibility.cells).toMatchObject([{ cellId: cell, status: 'reproduced' }]);
    // The rerun was a queued run of its own kind, taken by B's worker: A (no workers) computed nothing.
    const reruns = await dataSource.query(`SELECT status, instance FROM analysis_run WHERE cell_id = $1 AND purpose = 'reproducibility'`, [cell]);
    expect(reruns).toEqual([{ status: 'finished', instance: 'instance-b' }]);
  }, 60_000);

  it('counts failed sign-ins on both instances against one limit (ASVS V2.2.1)', async () => {
    const target = await makeUser(dataSource, { label: 'limited' });
    const browser = new Browser();
    await browser.begin(a);
    const attempt = (instance: Instance, password: string) => browser.call(instance, 'POST', '/api/auth/sign-in', { email: target.email, password });
    for (const instance of [a, b, a, b]) expect((await attempt(instance, 'wrong-password')).status).toBe(401);
    // Four failures split across A and B reach the limit of four: the next attempt is refused on either.
    const blocked = await attempt(a, target.password);
    expect(blocked.status).toBe(429);
    expect(blocked.body).toMatchObject({ error: { code: 'rate_limited' } });
    expect((await attempt(b, target.password)).status).toBe(429);
  });
});
