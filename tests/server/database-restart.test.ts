import net from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryDetail, Revision } from '@shared/api/entries.ts';
import { closeAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { startMigratedCluster } from '../support/fresh-database.ts';
import type { ThrowawayCluster } from '../support/pg-cluster.ts';
import { createTestApp, makeNotebook, makeUser, signIn, type Agent, type TestApp } from '../support/test-app.ts';
import { paragraphDoc } from './entries-support.ts';

/**
 * PostgreSQL stopped and started again under a running app: requests fail with a clear 503 while
 * it is down (no stack, no hang, no crash), and the same session works again once it is back.
 * The cluster is this file's own, so stopping it disturbs no other test.
 */
describe('PostgreSQL restarted while the app runs', () => {
  let cluster: ThrowawayCluster;
  let app: TestApp;
  let agent: Agent;
  let csrf: string;
  let entriesUrl: string;
  const unhandled: unknown[] = [];
  const onUnhandled = (error: unknown) => unhandled.push(error);

  beforeAll(async () => {
    process.on('unhandledRejection', onUnhandled);
    process.on('uncaughtException', onUnhandled);
    cluster = await startMigratedCluster('bifolio_restart');
    app = await createTestApp({ env: { DATABASE_URL: cluster.databaseUrl } });
    const person = await makeUser(app.dataSource, { label: 'restart' });
    const notebook = await makeNotebook(app.dataSource, person.user);
    entriesUrl = `/api/notebooks/${notebook.id}/entries`;
    ({ agent, csrf } = await signIn(app.app, person));
  });
  afterAll(async () => {
    process.off('unhandledRejection', onUnhandled);
    process.off('uncaughtException', onUnhandled);
    await closeAnalysisPool();
    await app?.close();
    await cluster?.stop();
  });

  /** Each call gives up after 10 s, so a hanging request fails the test instead of stalling it. */
  const get = (url: string) => agent.get(url).timeout(10_000);
  const post = (url: string, body: object) => agent.post(url).set('x-csrf-token', csrf).send(body).timeout(10_000);

  it('answers 503 database_unavailable while the database is down, and carries on with the same session once it is back', async () => {
    const created = await post(entriesUrl, { title: 'Kept across a restart', entryDate: '2026-12-01', tags: [] });
    expect(created.status).toBe(201);
    const entry = created.body as EntryDetail;
    const saved = await post(`${entriesUrl}/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Kept across a restart', entryDate: '2026-12-01', tags: [], document: paragraphDoc('Saved before the stop.'), outputs: {},
    });
    expect(saved.status).toBe(201);
    const before = saved.body as Revision;

    await cluster.pause();

    // Reads (the session lookup itself needs the database) and writes both fail cleanly.
    const read = await get(`${entriesUrl}/${entry.entry.id}`);
    const write = await post(`${entriesUrl}/${entry.entry.id}/revisions`, {
      baseRevisionId: before.id, title: 'Kept across a restart', entryDate: '2026-12-01', tags: [], document: paragraphDoc('Tried while down.'), outputs: {},
    });
    const me = await get('/api/auth/me');
    for (const res of [read, write, me]) {
      expect(res.status).toBe(503);
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body).toEqual({
        error: { code: 'database_unavailable', message: 'The database is not reachable; nothing was saved. Try again in a moment.' },
      });
      expect(JSON.stringify(res.body)).not.toMatch(/ECONNREFUSED|at .*\.ts|stack/i);
    }
    // The health check (asked without a session, as a monitor would) says which service is down.
    const health = await request(app.app).get('/api/health').timeout(10_000);
    expect(health.status).toBe(503);
    expect(health.body).toMatchObject({ ok: false, database: 'down', storage: 'up' });

    await cluster.resume();

    // The same cookie is still signed in; no restart of the app was needed.
    const again = await get('/api/auth/me');
    expect(again.status).toBe(200);
    expect(again.body.user.email).toMatch(/^restart\./);
    const detail = await get(`${entriesUrl}/${entry.entry.id}`);
    expect(detail.status).toBe(200);
    expect((detail.body as EntryDetail).head.id).toBe(before.id);

    // The revision saved before the stop is intact, and nothing of the refused save exists.
    const stored = (await get(`${entriesUrl}/${entry.entry.id}/revisions/${before.id}`)).body as Revision;
    expect(stored).toMatchObject({ id: before.id, contentHash: before.contentHash, document: before.document });
    const revisions = await get(`${entriesUrl}/${entry.entry.id}/revisions`);
    expect(revisions.body.revisions).toHaveLength(2);

    const next = await post(`${entriesUrl}/${entry.entry.id}/revisions`, {
      baseRevisionId: before.id, title: 'Kept across a restart', entryDate: '2026-12-01', tags: [], document: paragraphDoc('Saved after the restart.'), outputs: {},
    });
    expect(next.status).toBe(201);
    expect((next.body as Revision).number).toBe(before.number + 1);
    expect(await verifyAuditChain(app.dataSource.manager)).toMatchObject({ ok: true });
    expect(unhandled).toEqual([]);
  });

  it('answers 503 instead of hanging when the database accepts connections but never answers', async () => {
    await cluster.pause();
    // A silent listener on the database's port: connections open, and nothing ever comes back.
    const sockets = new Set<net.Socket>();
    const silent = net.createServer((socket) => sockets.add(socket));
    await new Promise<void>((resolve) => silent.listen(Number(new URL(cluster.databaseUrl).port), '127.0.0.1', resolve));
    try {
      const res = await get('/api/auth/me');
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('database_unavailable');
    } finally {
      for (const socket of sockets) socket.destroy();
      await new Promise<void>((resolve) => silent.close(() => resolve()));
      await cluster.resume();
    }
    expect((await get('/api/auth/me')).status).toBe(200);
    expect(unhandled).toEqual([]);
  });
});
