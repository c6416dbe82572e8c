import { Router, type Request } from 'express';
import { cellExportQuerySchema, entryExportQuerySchema } from '@shared/api/exports.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { contentDisposition } from '@server/services/attachments/content-disposition.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { writeEntryArchive } from '@server/services/exports/entry-archive.ts';
import { loadEntryRecord } from '@server/services/exports/entry-record.ts';
import { cellResultOf, loadExportRevision } from '@server/services/exports/load-export-revision.ts';
import { noteExport } from '@server/services/exports/note-export.ts';
import { recordHtml } from '@server/services/exports/record-html.ts';
import { resultCsv } from '@server/services/exports/result-csv.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string; cellId: string };
const params = (req: Request) => req.params as Params;

/** A file name for downloads from a title: letters, digits and dashes. */
const slug = (s: string) => s.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'entry';

/** Exports of an entry, mounted at /api/notebooks/:notebookId/entries/:entryId/export (contract: shared/api/exports.ts). */
export function exportsRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource, storage } = deps;
  router.use(requireUser);
  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });

  router.get('/cells/:cellId', async (req, res) => {
    const query = validate(cellExportQuerySchema, req.query);
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const revision = await loadExportRevision(ctx, entry, query.revisionId);
    const { result, source, names, cell } = cellResultOf(entry, revision, params(req).cellId);
    const name = `${slug(revision.title)}-r${revision.number}-${cell.kind}`;
    if (query.format === 'json') {
      res.setHeader('Content-Disposition', contentDisposition(`${name}.json`));
      res.json({ source, result });
      return;
    }
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', contentDisposition(`${name}.csv`));
    res.send(resultCsv(result, names));
  });

  router.get('/record', async (req, res) => {
    const query = validate(entryExportQuerySchema, req.query);
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const revision = await loadExportRevision(ctx, entry, query.revisionId);
    await noteExport(dataSource, { actor: ctx.actor, entry, revision, kind: 'record' });
    const record = await loadEntryRecord(ctx, entry, revision);
    res.setHeader('Content-Type', 'text/html; charset=utf-8');
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(recordHtml(record, new Date(), ctx.actor.name));
  });

  router.get('/archive', async (req, res) => {
    const query = validate(entryExportQuerySchema, req.query);
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const revision = await loadExportRevision(ctx, entry, query.revisionId);
    await noteExport(dataSource, { actor: ctx.actor, entry, revision, kind: 'archive' });
    const record = await loadEntryRecord(ctx, entry, revision);
    res.setHeader('Content-Type', 'application/zip');
    res.setHeader('Content-Disposition', contentDisposition(`${slug(revision.title)}-r${revision.number}.zip`));
    res.setHeader('Cache-Control', 'private, no-store');
    await writeEntryArchive(storage, record, res, { at: new Date(), by: ctx.actor.name });
  });

  return router;
}
