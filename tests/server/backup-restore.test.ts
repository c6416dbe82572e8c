import 'reflect-metadata';
import { execFile } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDataSource } from '@server/data-source.ts';
import { parseEnv } from '@server/env.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { startFakeS3, type FakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { KEY_TABLES, objectPath, sha256Of, sha256OfFile, type BackupManifest } from '../../scripts/backup/backup-manifest.ts';
import { createBackup } from '../../scripts/backup/create-backup.ts';
import { restoreBackup } from '../../scripts/backup/restore-backup.ts';
import { runSeed } from '../../seeds/seed.ts';
import { freePort } from '../support/free-port.ts';
import { startMigratedCluster } from '../support/fresh-database.ts';
import { startThrowawayCluster, type ThrowawayCluster } from '../support/pg-cluster.ts';

const run = promisify(execFile);
type Storage = ReturnType<typeof createS3Storage>;

/**
 * `npm run backup` and `npm run restore`: the demo (with its attachment and figures) is backed up
 * from a cluster and S3 fake of this file's own, then restored into a NEW cluster and a NEW
 * bucket, where the audit chain must verify and the files must hash to what the rows say.
 */
describe('backup and restore', () => {
  let tmp: string;
  let source: ThrowawayCluster;
  let target: ThrowawayCluster;
  let sourceS3: FakeS3;
  let targetS3: FakeS3;
  let sourceStorage: Storage;
  let targetStorage: Storage;
  let backupDir: string;
  let manifest: BackupManifest;

  const storageAt = (fake: FakeS3, bucket: string) => createS3Storage(parseEnv({ S3_ENDPOINT: fake.endpoint, S3_BUCKET: bucket }));
  const query = async <T,>(url: string, sql: string, params: unknown[] = []): Promise<T[]> => {
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    try {
      return (await client.query(sql, params)).rows as T[];
    } finally {
      await client.end();
    }
  };

  beforeAll(async () => {
    tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-backup-'));
    source = await startMigratedCluster('bifolio_backup_source');
    sourceS3 = await startFakeS3({ port: await freePort(), directory: path.join(tmp, 's3-source'), bucket: 'bifolio' });
    sourceStorage = storageAt(sourceS3, 'bifolio');
    const dataSource = await createDataSource(source.databaseUrl, { poolSize: 2 }).initialize();
    try {
      await runSeed(dataSource, () => undefined, { storage: sourceStorage, publicUrl: 'http://127.0.0.1:4800' });
    } finally {
      await dataSource.destroy();
    }
    backupDir = path.join(tmp, 'backup');
    manifest = await createBackup({ databaseUrl: source.databaseUrl, storage: sourceStorage, bucket: 'bifolio' }, backupDir);

    target = await startThrowawayCluster('bifolio_restored');
    targetS3 = await startFakeS3({ port: await freePort(), directory: path.join(tmp, 's3-target'), bucket: 'bifolio-restored' });
    targetStorage = storageAt(targetS3, 'bifolio-restored');
  }, 240_000);
  afterAll(async () => {
    sourceStorage?.client.destroy();
    targetStorage?.client.destroy();
    await sourceS3?.close();
    await targetS3?.close();
    await source?.stop();
    await target?.stop();
    rmSync(tmp, { recursive: true, force: true });
  });

  it('writes a manifest that describes the dump, every object, the key tables and the audit chain head', async () => {
    expect(manifest.database.sha256).toBe(await sha256OfFile(path.join(backupDir, 'database.dump')));
    expect(manifest.database.serverVersion).toMatch(/^\d+\.\d+/);
    // The demo's CSV attachment and two figures (SVG and PNG each).
    expect(manifest.objects.length).toBe(5);
    for (const object of manifest.objects) {
      const bytes = readFileSync(objectPath(backupDir, object.key));
      expect({ size: bytes.length, sha256: sha256Of(bytes) }).toEqual({ size: object.size, sha256: object.sha256 });
    }
    for (const table of KEY_TABLES) {
      const [{ n }] = await query<{ n: number }>(source.databaseUrl, `SELECT count(*)::int AS n FROM ${table}`);
      expect({ table, n }).toEqual({ table, n: manifest.counts[table] });
    }
    expect(manifest.counts.figure).toBe(2);
    expect(manifest.counts.attachment).toBe(1);
    const [head] = await query<{ seq: string; hash: string }>(source.databaseUrl, 'SELECT seq::text AS seq, hash FROM audit_event ORDER BY seq DESC LIMIT 1');
    expect(manifest.auditChainHead).toEqual(head);
  });

  it('restores into a new database and bucket: the audit chain verifies and every file hashes to its row', async () => {
    const report = await restoreBackup({ databaseUrl: target.databaseUrl, storage: targetStorage, bucket: 'bifolio-restored' }, backupDir);
    expect(report).toMatchObject({ objects: 5, counts: manifest.counts, auditEventsVerified: manifest.counts.audit_event });

    const restored = await createDataSource(target.databaseUrl, { poolSize: 1 }).initialize();
    try {
      expect(await verifyAuditChain(restored.manager)).toEqual({ ok: true, checked: manifest.counts.audit_event });
      const attachments = (await restored.query('SELECT storage_key, sha256, byte_size FROM attachment')) as { storage_key: string; sha256: string; byte_size: number }[];
      const figures = (await restored.query('SELECT svg_key, svg_sha256, png_key, png_sha256 FROM figure')) as { svg_key: string; svg_sha256: string; png_key: string; png_sha256: string }[];
      const expected = [
        ...attachments.map((a) => ({ key: a.storage_key, sha256: a.sha256 })),
        ...figures.flatMap((f) => [{ key: f.svg_key, sha256: f.svg_sha256 }, { key: f.png_key, sha256: f.png_sha256 }]),
      ];
      expect(expected).toHaveLength(5);
      for (const { key, sha256 } of expected) {
        const object = await targetStorage.read(key);
        expect({ key, sha256: object && sha256Of(object.body) }).toEqual({ key, sha256 });
      }
      // Downloads keep their original file name.
      const [attachment] = attachments;
      const [before, after] = await Promise.all([sourceStorage.read(attachment.storage_key), targetStorage.read(attachment.storage_key)]);
      expect(after?.contentDisposition).toBe(before?.contentDisposition);
      expect(after?.contentDisposition).toContain('pilot-tank-readings');
      expect(after?.contentType).toBe(before?.contentType);
    } finally {
      await restored.destroy();
    }
  }, 120_000);

  it('refuses to restore over a database that has data, and says how to do it on purpose', async () => {
    const into = { databaseUrl: target.databaseUrl, storage: targetStorage, bucket: 'bifolio-restored' };
    await expect(restoreBackup(into, backupDir)).rejects.toThrow(/^The database at DATABASE_URL already has \d+ tables \(.*\): restore into a new, empty database, or pass --force/);

    // The command says the same and exits with 1.
    const cli = await run(process.execPath, ['--import', 'tsx', 'scripts/restore.ts', backupDir], {
      env: { ...process.env, DATABASE_URL: target.databaseUrl, S3_ENDPOINT: targetS3.endpoint, S3_BUCKET: 'bifolio-restored' },
    }).then(
      () => ({ code: 0, stderr: '' }),
      (e: { code: number; stderr: string }) => ({ code: e.code, stderr: e.stderr }),
    );
    expect(cli.code).toBe(1);
    expect(cli.stderr).toMatch(/Restore failed: The database at DATABASE_URL already has \d+ tables/);

    // With --force it replaces what is there, and the result verifies again.
    const forced = await restoreBackup(into, backupDir, { force: true });
    expect(forced).toMatchObject({ counts: manifest.counts, auditEventsVerified: manifest.counts.audit_event });
  }, 120_000);

  it('refuses a backup with a damaged object, naming its key, and restores nothing', async () => {
    const damaged = path.join(tmp, 'damaged');
    cpSync(backupDir, damaged, { recursive: true });
    const victim = manifest.objects.find((o) => o.key.endsWith('.png'))!;
    const file = objectPath(damaged, victim.key);
    const bytes = readFileSync(file);
    bytes[bytes.length - 1] ^= 0xff;
    writeFileSync(file, bytes);

    await query(target.databaseUrl, 'CREATE DATABASE bifolio_damaged');
    const emptyUrl = target.databaseUrl.replace(/\/bifolio_restored$/, '/bifolio_damaged');
    const emptyS3 = await startFakeS3({ port: await freePort(), directory: path.join(tmp, 's3-damaged'), bucket: 'bifolio-damaged' });
    const emptyStorage = storageAt(emptyS3, 'bifolio-damaged');
    try {
      const attempt = restoreBackup({ databaseUrl: emptyUrl, storage: emptyStorage, bucket: 'bifolio-damaged' }, damaged);
      await expect(attempt).rejects.toThrow(`The object "${victim.key}" does not match the manifest`);
      await expect(attempt).rejects.toThrow(/the backup is damaged; nothing was restored\.$/);
      const tables = await query(emptyUrl, `SELECT 1 FROM pg_tables WHERE schemaname = 'public'`);
      expect(tables).toEqual([]);
      const first = await emptyStorage.list('')[Symbol.asyncIterator]().next();
      expect(first.done).toBe(true);
    } finally {
      emptyStorage.client.destroy();
      await emptyS3.close();
    }
  });
});
