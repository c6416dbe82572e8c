import type { DataSource } from 'typeorm';
import type { FileStorage } from '@server/storage/file-storage.ts';

/** Objects younger than this may belong to an upload whose row is still being written. */
export const ORPHAN_GRACE_MINUTES = 30;

const FILE_KEY = /^notebooks\/[0-9a-f-]{36}\/entries\/[0-9a-f-]{36}\/(attachments\/[0-9a-f-]{36}|figures\/[0-9a-f-]{36}\.(svg|png))$/;

/**
 * Deletes attachment and figure objects that no row points at (left behind when the process
 * stopped between storing an object and recording it), once they are older than the grace
 * period. Returns the deleted keys. Meant to run now and then (at start-up or from a job).
 */
export async function sweepOrphanedObjects(
  deps: { dataSource: DataSource; storage: FileStorage },
  options: { now?: Date; graceMinutes?: number } = {},
): Promise<string[]> {
  const cutoff = (options.now ?? new Date()).getTime() - (options.graceMinutes ?? ORPHAN_GRACE_MINUTES) * 60_000;
  const candidates: string[] = [];
  for await (const o of deps.storage.list('notebooks/')) {
    if (FILE_KEY.test(o.key) && o.lastModified.getTime() < cutoff) candidates.push(o.key);
  }
  if (candidates.length === 0) return [];
  const known = (await deps.dataSource.query(
    `SELECT k FROM unnest($1::text[]) AS k
      WHERE EXISTS (SELECT 1 FROM attachment a WHERE a.storage_key = k)
         OR EXISTS (SELECT 1 FROM figure f WHERE f.svg_key = k OR f.png_key = k)`,
    [candidates],
  )) as { k: string }[];
  const keep = new Set(known.map((r) => r.k));
  const orphans = candidates.filter((k) => !keep.has(k));
  for (const key of orphans) await deps.storage.delete(key);
  return orphans;
}
