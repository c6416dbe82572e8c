import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';

/**
 * A backup is a folder: `manifest.json`, `database.dump` (pg_dump's custom format) and
 * `objects/<key>` for every object of the bucket. The manifest says what a faithful restore
 * must give back: the dump's SHA-256, each object's size and SHA-256, the row counts of the
 * key tables and the head of the audit chain, all read from the dump's own snapshot.
 */
export const MANIFEST_FILE = 'manifest.json';
export const DUMP_FILE = 'database.dump';
export const OBJECTS_DIR = 'objects';

/** Tables whose row counts the manifest records and a restore checks. */
export const KEY_TABLES = [
  'app_user',
  'notebook',
  'membership',
  'entry',
  'revision',
  'signature',
  'review',
  'comment',
  'measurement_set',
  'attachment',
  'figure',
  'audit_event',
] as const;

const sha256Hex = z.string().regex(/^[0-9a-f]{64}$/, { message: 'Use a SHA-256 in hex' });

export const backupManifestSchema = z.object({
  format: z.literal('bifolio-backup'),
  version: z.literal(1),
  createdAt: z.iso.datetime(),
  database: z.object({
    file: z.literal(DUMP_FILE),
    sha256: sha256Hex,
    bytes: z.number().int().min(0),
    /** The server's version, e.g. "15.14". */
    serverVersion: z.string(),
  }),
  storage: z.object({ bucket: z.string() }),
  objects: z.array(
    z.object({
      key: z.string().min(1),
      size: z.number().int().min(0),
      sha256: sha256Hex,
      contentType: z.string().nullable(),
      contentDisposition: z.string().nullable(),
    }),
  ),
  counts: z.record(z.enum(KEY_TABLES), z.number().int().min(0)),
  /** The last audit event when the backup was taken (null for an empty trail). */
  auditChainHead: z.object({ seq: z.string(), hash: sha256Hex }).nullable(),
});
export type BackupManifest = z.infer<typeof backupManifestSchema>;
export type BackupObject = BackupManifest['objects'][number];

/** A backup that cannot be made or restored, with a message that says why and what to do. */
export class BackupError extends Error {
  override name = 'BackupError';
}

export const sha256Of = (data: Buffer) => createHash('sha256').update(data).digest('hex');

export function sha256OfFile(file: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(file)
      .on('data', (chunk) => hash.update(chunk))
      .on('error', reject)
      .on('end', () => resolve(hash.digest('hex')));
  });
}

/**
 * Where an object's bytes live in the backup folder. Keys are made of ids and slashes; one that
 * could leave the folder (absolute, `..`, empty segments) is refused.
 */
export function objectPath(folder: string, key: string): string {
  const segments = key.split('/');
  if (key.startsWith('/') || segments.some((s) => s === '' || s === '.' || s === '..' || s.includes('\\'))) {
    throw new BackupError(`The object key "${key}" cannot be stored as a file (it is absolute or has an empty, "." or ".." part).`);
  }
  return path.join(folder, OBJECTS_DIR, ...segments);
}

/** Reads and checks `manifest.json`; every problem is named by its field. */
export function readManifest(folder: string): BackupManifest {
  const file = path.join(folder, MANIFEST_FILE);
  if (!existsSync(file)) throw new BackupError(`${file} does not exist: give the folder a backup was written to.`);
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(file, 'utf8'));
  } catch (error) {
    throw new BackupError(`${file} is not valid JSON: ${(error as Error).message}`);
  }
  const parsed = backupManifestSchema.safeParse(json);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.') || '(manifest)'}: ${i.message}`);
    throw new BackupError(`${file} is not a Bifolio backup manifest:\n${problems.map((p) => `  - ${p}`).join('\n')}`);
  }
  return parsed.data;
}
