import { z } from 'zod';

/**
 * Exports of an entry. Paths are under /api/notebooks/:notebookId/entries/:entryId/export.
 *
 * GET /export/cells/:cellId?format=csv|json&revisionId=   -> the cell's result data (branch points, fold-curve points,
 *                                                           trajectory samples, equilibria) as CSV, or the whole result
 *                                                           with where it came from as JSON (default: the head revision)
 * GET /export/record?revisionId=                          -> a printable HTML record: document, results, figures,
 *                                                           attachments, signatures and the entry's audit trail
 * GET /export/archive?revisionId=                         -> one ZIP: document, results, figures, attachments, audit
 *
 * Every member may export. The record and the archive are noted in the audit trail ("export.created").
 */
export const EXPORT_FORMATS = ['csv', 'json'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export const cellExportQuerySchema = z.object({
  format: z.enum(EXPORT_FORMATS, { message: 'format is "csv" or "json"' }).default('csv'),
  revisionId: z.uuid({ message: 'revisionId must be a revision id' }).optional(),
});
export type CellExportQuery = z.infer<typeof cellExportQuerySchema>;

export const entryExportQuerySchema = z.object({
  revisionId: z.uuid({ message: 'revisionId must be a revision id' }).optional(),
});
export type EntryExportQuery = z.infer<typeof entryExportQuerySchema>;

/** Where an exported result came from (the JSON export's `source`, and the archive's manifest). */
export const exportSourceSchema = z.object({
  entryId: z.uuid(),
  revisionId: z.uuid(),
  revisionNumber: z.number().int(),
  contentHash: z.string(),
  cellId: z.uuid(),
  cellKind: z.string(),
  inputHash: z.string(),
  engineVersion: z.string(),
  computedAt: z.string(),
});
export type ExportSource = z.infer<typeof exportSourceSchema>;

/** Files at the top of an entry archive. */
export const ARCHIVE_FILES = {
  manifest: 'manifest.json',
  entry: 'entry.json',
  text: 'document.txt',
  record: 'record.html',
  audit: 'audit.json',
} as const;
