import 'reflect-metadata';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryDetail, Revision } from '@shared/api/entries.ts';
import { createDataSource } from '@server/data-source.ts';
import { startSmtpSink, type SmtpSink } from '@server/mail/smtp-sink.ts';
import { AUDIT_CHAIN_LOCK } from '@server/services/audit/record-event.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { startFakeS3, type FakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { freePort } from '../support/free-port.ts';
import { startMigratedCluster } from '../support/fresh-database.ts';
import type { ThrowawayCluster } from '../support/pg-cluster.ts';
import { spawnServer, type ServerProcess } from '../support/server-process.ts';
import { makeNotebook, makeUser, signIn } from '../support/test-app.ts';
import { paragraphDoc } from './entries-support.ts';

/**
 * The server process killed (SIGKILL) while a revision save is inside its transaction. The save is
 * stopped at a known point: after the revision row is inserted, the audit append waits for the
 * chain's advisory lock, which this test holds from its own connection. Nothing of the save may
 * survive the kill, and the same save succeeds whole once the server is started again.
 */
describe('server killed during a revision save', () => {
  let cluster: ThrowawayCluster;
  let s3: FakeS3;
  let sink: SmtpSink;
  let dataSource: DataSource;
  let server: ServerProcess | null = null;
  let tmp: string;
  let serverEnv: Record<string, string>;

  beforeAll(async () => {
    tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-kill-'));
    cluster = await startMigratedCluster('bifolio_kill');
    const [s3Port, smtpPort] = [await freePort(), await freePort()];
    s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: 'bifolio' });
    sink = await startSmtpSink({ port: smtpPort, directory: path.join(tmp, 'mail') });
    serverEnv = { DATABASE_URL: cluster.databaseUrl, S3_ENDPOINT: s3.endpoint, S3_BUCKET: 'bifolio', SMTP_PORT: String(smtpPort), BIFOLIO_DATA_DIR: tmp };
    dataSource = await createDataSource(cluster.databaseUrl, { poolSize: 2 }).initialize();
  });
  afterAll(async () => {
    await server?.kill('SIGTERM');
    await dataSource?.destroy();
    await sink?.close();
    await s3?.close();
    await cluster?.stop();
    rmSync(tmp, { recursive: true, force: true });
  });

  it('leaves no half revision behind, and the same save succeeds whole after a restart', { timeout: 120_000 }, async () => {
    const person = await makeUser(dataSource, { label: 'killed' });
    const notebook = await makeNotebook(dataSource, person.user);
    server = await spawnServer(serverEnv);
    const { agent, csrf } = await signIn(server.url, person);
    const entriesUrl = `/api/notebooks/${notebook.id}/entries`;
    const created = await agent.post(entriesUrl).set('x-csrf-token', csrf).send({ title: 'Cut short', entryDate: '2026-12-04', tags: [] });
    expect(created.status).toBe(201);
    const entry = created.body as EntryDetail;
    const save = { baseRevisionId: entry.head.id, title: 'Cut short', entryDate: '2026-12-04', tags: [], document: paragraphDoc('Saved as the server dies.'), outputs: {} };
    const chainBefore = await verifyAuditChain(dataSource.manager);
    expect(chainBefore.ok).toBe(true);

    // Hold the audit chain's lock, then start the save: it blocks inside its transaction.
    const holder = new pg.Client({ connectionString: cluster.databaseUrl });
    await holder.connect();
    try {
      await holder.query('SELECT pg_advisory_lock($1)', [AUDIT_CHAIN_LOCK]);
      const pending = agent.post(`${entriesUrl}/${entry.entry.id}/revisions`).set('x-csrf-token', csrf).send(save).then(
        (res) => res.status,
        () => 'no answer' as const,
      );
      const blocked = await waitFor(async () => {
        const { rows } = await holder.query<{ pid: number; xid: string | null }>(
          `SELECT a.pid, a.backend_xid::text AS xid
             FROM pg_stat_activity a JOIN pg_locks l ON l.pid = a.pid
            WHERE l.locktype = 'advisory' AND NOT l.granted AND l.objid = $1
              AND a.wait_event_type = 'Lock' AND a.state = 'active' AND a.query LIKE '%pg_advisory_xact_lock%'`,
          [AUDIT_CHAIN_LOCK],
        );
        return rows[0] ?? null;
      });
      // The waiting transaction has already written (the revision row): it holds a transaction id.
      expect(blocked.xid).not.toBeNull();

      await server.kill('SIGKILL');
      expect(await pending).toBe('no answer');
      await holder.query('SELECT pg_advisory_unlock($1)', [AUDIT_CHAIN_LOCK]);
      // The orphaned backend gets the lock, finds its client gone, and rolls back.
      await waitFor(async () => {
        const { rowCount } = await holder.query('SELECT 1 FROM pg_stat_activity WHERE pid = $1', [blocked.pid]);
        return rowCount === 0 ? true : null;
      });
    } finally {
      await holder.end();
    }

    // Nothing of the save: no revision row, no audit event, the head unchanged, the chain whole.
    const revisions = (await dataSource.query('SELECT number FROM revision WHERE entry_id = $1 ORDER BY number', [entry.entry.id])) as { number: number }[];
    expect(revisions.map((r) => r.number)).toEqual([1]);
    const [head] = (await dataSource.query('SELECT head_revision_id, revision_count FROM entry WHERE id = $1', [entry.entry.id])) as { head_revision_id: string; revision_count: number }[];
    expect(head).toEqual({ head_revision_id: entry.head.id, revision_count: 1 });
    const orphans = (await dataSource.query(
      `SELECT seq FROM audit_event e WHERE e.entity_type = 'revision' AND NOT EXISTS (SELECT 1 FROM revision r WHERE r.id::text = e.entity_id)`,
    )) as unknown[];
    expect(orphans).toEqual([]);
    expect(await verifyAuditChain(dataSource.manager)).toEqual(chainBefore);

    // Started again, the server takes the same save (same session cookie, same base) whole.
    server = await spawnServer(serverEnv, { port: server.port });
    const again = await agent.post(`${entriesUrl}/${entry.entry.id}/revisions`).set('x-csrf-token', csrf).send(save);
    expect(again.status).toBe(201);
    const revision = again.body as Revision;
    expect(revision.number).toBe(2);
    const [after] = (await dataSource.query('SELECT head_revision_id FROM entry WHERE id = $1', [entry.entry.id])) as { head_revision_id: string }[];
    expect(after.head_revision_id).toBe(revision.id);
    const recorded = (await dataSource.query(`SELECT entity_id FROM audit_event WHERE action = 'revision.recorded' AND summary->>'entryId' = $1 ORDER BY seq`, [entry.entry.id])) as { entity_id: string }[];
    expect(recorded).toEqual([{ entity_id: entry.head.id }, { entity_id: revision.id }]);
    expect(await verifyAuditChain(dataSource.manager)).toMatchObject({ ok: true, checked: chainBefore.checked + 1 });
  });
});

/** Polls `probe` every 50 ms until it returns a value (at most 15 s). */
async function waitFor<T>(probe: () => Promise<T | null>, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== null) return value;
    if (Date.now() > deadline) throw new Error(`Gave up waiting after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
