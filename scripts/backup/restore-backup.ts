import 'reflect-metadata';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import pg from 'pg';
import { createDataSource } from '@server/data-source.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { BackupError, KEY_TABLES, objectPath, readManifest, sha256Of, sha256OfFile, type BackupManifest, type BackupObject } from './backup-manifest.ts';
import type { BackupTarget } from './create-backup.ts';
import { runPostgresTool, serverVersion } from './postgres-tools.ts';

export interface RestoreReport {
  objects: number;
  bytes: number;
  counts: BackupManifest['counts'];
  /** Events checked by the audit chain verification of the restored database. */
  auditEventsVerified: number;
}

const DAMAGED = 'the backup is damaged; nothing was restored';

/** An object's bytes from the backup folder, refused unless its size and SHA-256 are the manifest's. */
function readVerifiedObject(folder: string, object: BackupObject): Buffer {
  const file = objectPath(folder, object.key);
  if (!existsSync(file)) throw new BackupError(`The object "${object.key}" is listed in the manifest but missing from the backup (${file}): ${DAMAGED}.`);
  const body = readFileSync(file);
  const sha256 = sha256Of(body);
  if (body.length !== object.size || sha256 !== object.sha256) {
    throw new BackupError(
      `The object "${object.key}" does not match the manifest (${body.length} bytes, SHA-256 ${sha256}; the manifest says ${object.size} bytes, ${object.sha256}): ${DAMAGED}.`,
    );
  }
  return body;
}

/** Refuses a database or bucket that already holds something, unless `force`. */
async function checkTargetIsEmpty(client: pg.Client, target: BackupTarget, force: boolean): Promise<void> {
  if (force) return;
  const { rows } = await client.query<{ name: string }>(
    `SELECT schemaname || '.' || tablename AS name FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1`,
  );
  if (rows.length > 0) {
    const some = rows.slice(0, 3).map((r) => r.name).join(', ');
    throw new BackupError(
      `The database at DATABASE_URL already has ${rows.length} tables (${some}${rows.length > 3 ? ', …' : ''}): restore into a new, empty database, or pass --force to replace its contents with the backup.`,
    );
  }
  const first = await target.storage.list('')[Symbol.asyncIterator]().next();
  if (!first.done) {
    throw new BackupError(`The bucket "${target.bucket}" already holds objects (e.g. "${first.value.key}"): restore into an empty bucket, or pass --force to write the backup's objects over it.`);
  }
}

/**
 * Restores a backup made by createBackup into the database and bucket of `target`.
 *
 * Everything is checked before anything is written: the manifest, the dump's SHA-256 and every
 * object's size and SHA-256 (a damaged object is refused by its key), and that the database and
 * bucket are empty (unless `force`). Then pg_restore loads the dump in one transaction, the
 * objects are uploaded (each checked again as it is read for upload), and the restored database
 * is verified: the audit chain holds and ends at the manifest's head, and the key tables have
 * the manifest's row counts.
 */
export async function restoreBackup(
  target: BackupTarget,
  folder: string,
  options: { force?: boolean; log?: (line: string) => void } = {},
): Promise<RestoreReport> {
  const log = options.log ?? (() => undefined);
  const manifest = readManifest(folder);
  const dumpFile = path.join(folder, manifest.database.file);
  if (!existsSync(dumpFile)) throw new BackupError(`${dumpFile} is missing: ${DAMAGED}.`);
  const dumpSha = await sha256OfFile(dumpFile);
  if (dumpSha !== manifest.database.sha256) {
    throw new BackupError(`${manifest.database.file} does not match the manifest (SHA-256 ${dumpSha}; the manifest says ${manifest.database.sha256}): ${DAMAGED}.`);
  }
  for (const object of manifest.objects) readVerifiedObject(folder, object);
  log(`Checked the dump and ${manifest.objects.length} objects against the manifest of ${manifest.createdAt}.`);

  const client = new pg.Client({ connectionString: target.databaseUrl });
  await client.connect().catch((error: Error) => {
    throw new BackupError(`Cannot reach the database at DATABASE_URL: ${error.message}`);
  });
  try {
    const { major } = await serverVersion(client);
    const dumpMajor = Number.parseInt(manifest.database.serverVersion, 10);
    if (dumpMajor > major) {
      throw new BackupError(`The backup comes from PostgreSQL ${manifest.database.serverVersion}, newer than this server (${major}): restore it into PostgreSQL ${dumpMajor} or later.`);
    }
    await checkTargetIsEmpty(client, target, options.force ?? false);
    log(`Restoring the database with pg_restore ${major}…`);
    await runPostgresTool('pg_restore', major, target.databaseUrl, [
      '--no-owner',
      '--no-privileges',
      '--exit-on-error',
      '--single-transaction',
      ...(options.force ? ['--clean', '--if-exists'] : []),
      dumpFile,
    ]);

    let bytes = 0;
    for (const object of manifest.objects) {
      const body = readVerifiedObject(folder, object);
      await target.storage.putStream(object.key, Readable.from([body]), {
        contentType: object.contentType ?? 'application/octet-stream',
        byteLength: body.length,
        ...(object.contentDisposition ? { contentDisposition: object.contentDisposition } : {}),
      });
      bytes += body.length;
    }
    log(`Uploaded ${manifest.objects.length} objects (${bytes} bytes) to the bucket "${target.bucket}".`);

    const counts = {} as BackupManifest['counts'];
    for (const table of KEY_TABLES) {
      const { rows } = await client.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${pg.escapeIdentifier(table)}`);
      counts[table] = rows[0].n;
    }
    const differing = KEY_TABLES.filter((t) => counts[t] !== manifest.counts[t]);
    if (differing.length) {
      throw new BackupError(`The restored database does not have the backup's rows: ${differing.map((t) => `${t} ${counts[t]} (backup: ${manifest.counts[t]})`).join(', ')}.`);
    }
    const auditEventsVerified = await verifyRestoredChain(target.databaseUrl, manifest);
    log(`The audit chain holds: ${auditEventsVerified} events, ending at the backup's head.`);
    return { objects: manifest.objects.length, bytes, counts, auditEventsVerified };
  } finally {
    await client.end();
  }
}

async function verifyRestoredChain(databaseUrl: string, manifest: BackupManifest): Promise<number> {
  const dataSource = await createDataSource(databaseUrl, { poolSize: 1 }).initialize();
  try {
    const report = await verifyAuditChain(dataSource.manager);
    if (!report.ok) {
      throw new BackupError(`The restored audit chain is broken at sequence ${report.brokenAt} (${report.reason}); ${report.checked} events before it hold.`);
    }
    const rows = (await dataSource.query('SELECT seq::text AS seq, hash FROM audit_event ORDER BY seq DESC LIMIT 1')) as { seq: string; hash: string }[];
    const head = rows[0] ?? null;
    if (head?.hash !== manifest.auditChainHead?.hash) {
      throw new BackupError(`The restored audit chain ends at ${head ? `sequence ${head.seq}` : 'no event'}, not at the backup's head (${manifest.auditChainHead ? `sequence ${manifest.auditChainHead.seq}` : 'no event'}).`);
    }
    return report.checked;
  } finally {
    await dataSource.destroy();
  }
}
