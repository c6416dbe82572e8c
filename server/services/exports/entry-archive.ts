import type { Writable } from 'node:stream';
import { ZipArchive } from 'archiver';
import { ARCHIVE_FILES } from '@shared/api/exports.ts';
import { canonicalJson } from '@shared/cells/hash.ts';
import { documentToPlainText } from '@shared/editor/document.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { cellResultOf } from './load-export-revision.ts';
import { cellsWithResults, type EntryRecord } from './entry-record.ts';
import { recordHtml } from './record-html.ts';
import { resultCsv } from './result-csv.ts';

/** A name safe inside a ZIP: no folders, no "..", no control characters. */
function zipName(name: string): string {
  // eslint-disable-next-line no-control-regex
  return name.replace(/[\u0000-\u001f\u007f/\\:*?"<>|]/g, '_').replace(/^\.+/, '_') || 'file';
}

/**
 * Writes the whole entry as one ZIP to `out`: manifest, entry and revision JSON, the document as
 * text, the printable record, each result as JSON and CSV, figures (SVG and PNG), attachments
 * (original bytes) and the audit trail. Objects are read from storage one at a time.
 */
export async function writeEntryArchive(
  storage: FileStorage,
  record: EntryRecord,
  out: Writable,
  exported: { at: Date; by: string },
): Promise<void> {
  const zip = new ZipArchive({ zlib: { level: 6 } });
  const done = new Promise<void>((resolve, reject) => {
    out.on('close', resolve);
    out.on('finish', resolve);
    zip.on('error', reject);
  });
  zip.pipe(out);
  const { entry, revision } = record;
  const files: { path: string; sha256?: string }[] = [];
  const add = (path: string, body: string | Buffer, sha256?: string) => {
    zip.append(body, { name: path, date: exported.at });
    files.push({ path, ...(sha256 ? { sha256 } : {}) });
  };

  add(
    ARCHIVE_FILES.entry,
    JSON.stringify(
      {
        entry: { id: entry.id, notebookId: entry.notebookId, title: entry.title, entryDate: entry.entryDate, tags: entry.tags, status: entry.status },
        revision: {
          id: revision.id,
          number: revision.number,
          title: revision.title,
          entryDate: revision.entryDate,
          tags: revision.tags,
          author: revision.author.name,
          createdAt: revision.createdAt.toISOString(),
          contentHash: revision.contentHash,
          document: revision.document,
          outputs: revision.outputs,
        },
      },
      null,
      2,
    ),
  );
  add(ARCHIVE_FILES.text, documentToPlainText(revision.document));
  add(ARCHIVE_FILES.record, recordHtml(record, exported.at, exported.by));
  for (const cell of cellsWithResults(revision)) {
    const { result, source, names } = cellResultOf(entry, revision, cell.id);
    add(`results/${cell.id}.json`, JSON.stringify({ source, result }, null, 2));
    add(`results/${cell.id}.csv`, resultCsv(result, names));
  }
  for (const f of record.figures) {
    const [svg, png] = [await storage.get(f.svgKey), await storage.get(f.pngKey)];
    if (svg) add(`figures/${f.id}.svg`, svg, f.svgSha256);
    if (png) add(`figures/${f.id}.png`, png, f.pngSha256);
  }
  for (const a of record.attachments) {
    const bytes = await storage.get(a.storageKey);
    if (bytes) add(`attachments/${a.id}-${zipName(a.originalName)}`, bytes, a.sha256);
  }
  for (const m of record.measurements) add(`measurements/${m.id}.json`, JSON.stringify({ name: m.name, parameter: m.parameterName, state: m.stateName, rows: m.rows }, null, 2));
  add(ARCHIVE_FILES.audit, JSON.stringify({ events: record.audit, signatures: record.signatures.map((s) => ({ printedName: s.printedName, meaning: s.meaning, signedAt: s.signedAt.toISOString(), contentHash: s.contentHash })) }, null, 2));
  add(
    ARCHIVE_FILES.manifest,
    canonicalJson({ entryId: entry.id, revisionId: revision.id, contentHash: revision.contentHash, exportedAt: exported.at.toISOString(), exportedBy: exported.by, files }),
  );
  await zip.finalize();
  await done;
}
