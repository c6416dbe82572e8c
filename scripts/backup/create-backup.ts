import { existsSync, mkdirSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import type { FileStorage } from '@server/storage/file-storage.ts';
import {
  BackupError,
  DUMP_FILE,
  KEY_TABLES,
  MANIFEST_FILE,
  objectPath,
  sha256Of,
  sha256OfFile,
  type BackupManifest,
  type BackupObject,
} from './backup-manifest.ts';
import { runPostgresTool, serverVersion } from './postgres-tools.ts';

export interface BackupTarget {
  databaseUrl: string;
  storage: FileStorage;
  /** The bucket's name, recorded in the manifest. */
  bucket: string;
}

/**
 * Backs up the database and every object of the bucket into `folder` (new or empty).
 *
 * The dump (pg_dump, custom format) is taken from an exported snapshot, and the row counts and
 * the audit chain's head are read in that same snapshot, so the manifest describes exactly what
 * the dump holds. Objects are listed after it: any object a recorded row points at is there.
 */
export async function createBackup(target: BackupTarget, folder: string, log: (line: string) => void = () => undefined): Promise<BackupManifest> {
  if (existsSync(folder) && (!statSync(folder).isDirectory() || readdirSync(folder).length > 0)) {
    throw new BackupError(`${folder} is not an empty folder: back up into a new or empty one, so no older backup is mixed into this one.`);
  }
  mkdirSync(folder, { recursive: true });

  const client = new pg.Client({ connectionString: target.databaseUrl });
  await client.connect().catch((error: Error) => {
    throw new BackupError(`Cannot reach the database at DATABASE_URL: ${error.message}`);
  });
  let snapshotState: Pick<BackupManifest, 'counts' | 'auditChainHead'> & { version: string };
  const dumpFile = path.join(folder, DUMP_FILE);
  try {
    const { version, major } = await serverVersion(client);
    await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
    const { rows: [{ snapshot }] } = await client.query<{ snapshot: string }>('SELECT pg_export_snapshot() AS snapshot');
    const counts = {} as BackupManifest['counts'];
    for (const table of KEY_TABLES) {
      const { rows } = await client.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${pg.escapeIdentifier(table)}`);
      counts[table] = rows[0].n;
    }
    const { rows: head } = await client.query<{ seq: string; hash: string }>('SELECT seq::text AS seq, hash FROM audit_event ORDER BY seq DESC LIMIT 1');
    log(`Dumping the database (PostgreSQL ${version}) with pg_dump ${major}…`);
    await runPostgresTool('pg_dump', major, target.databaseUrl, ['--format=custom', '--no-owner', '--no-privileges', `--snapshot=${snapshot}`, `--file=${dumpFile}`]);
    await client.query('COMMIT');
    snapshotState = { counts, auditChainHead: head[0] ?? null, version };
  } finally {
    await client.end();
  }

  const objects: BackupObject[] = [];
  for await (const { key } of target.storage.list('')) {
    const object = await target.storage.read(key);
    if (!object) continue; // deleted since it was listed
    const file = objectPath(folder, key);
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, object.body);
    objects.push({ key, size: object.body.length, sha256: sha256Of(object.body), contentType: object.contentType, contentDisposition: object.contentDisposition });
  }
  log(`Copied ${objects.length} objects from the bucket "${target.bucket}".`);

  const manifest: BackupManifest = {
    format: 'bifolio-backup',
    version: 1,
    createdAt: new Date().toISOString(),
    database: { file: DUMP_FILE, sha256: await sha256OfFile(dumpFile), bytes: statSync(dumpFile).size, serverVersion: snapshotState.version },
    storage: { bucket: target.bucket },
    objects,
    counts: snapshotState.counts,
    auditChainHead: snapshotState.auditChainHead,
  };
  writeFileSync(path.join(folder, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  log(`Wrote ${path.join(folder, MANIFEST_FILE)}.`);
  return manifest;
}
