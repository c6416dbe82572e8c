import { Router, type Request } from 'express';
import {
  createEntrySchema,
  listEntriesQuerySchema,
  recordRevisionSchema,
  restoreRevisionSchema,
  runCellSchema,
  saveDraftSchema,
} from '@shared/api/entries.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { NotFoundError, ValidationError } from '@server/errors/index.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentRunProgress } from '@server/presenters/cell-output.presenter.ts';
import { presentDraft, presentEntryDetail, presentEntrySummary } from '@server/presenters/entry.presenter.ts';
import { presentRevision, presentRevisionSummary } from '@server/presenters/revision.presenter.ts';
import { cancelRun } from '@server/services/analysis/cancel-run.ts';
import { runCell } from '@server/services/analysis/run-cell.ts';
import { findActiveRun } from '@server/services/analysis/run-progress.ts';
import { createEntry } from '@server/services/entries/create-entry.ts';
import { getEntryDetail } from '@server/services/entries/get-entry-detail.ts';
import { listEntries } from '@server/services/entries/list-entries.ts';
import { authorizeInNotebook, loadEntry } from '@server/services/entries/load-entry.ts';
import { discardDraft, saveDraft } from '@server/services/entries/save-draft.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { isUuid } from '@server/services/ids.ts';
import { getRevision, listRevisions } from '@server/services/revisions/list-revisions.ts';
import { recordRevision } from '@server/services/revisions/record-revision.ts';
import { restoreRevision } from '@server/services/revisions/restore-revision.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string; revisionId: string; cellId: string };
const params = (req: Request) => req.params as Params;

/**
 * Entries of a notebook, their revisions, the caller's draft and cell runs. Mounted at
 * /api/notebooks/:notebookId (see shared/api/entries.ts for the contract). Each handler:
 * authenticate → validate → (transaction) → load and authorize → service → present.
 */
export function entriesRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource, runQueue } = deps;
  router.use(requireUser);

  /** Reads need no transaction. */
  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });
  /** Writes run in one transaction with the caller as actor. */
  const writing = <T>(req: Request, work: (ctx: ActingContext) => Promise<T>): Promise<T> => {
    const actor = currentUser(req);
    return dataSource.transaction((manager) => work({ actor, manager, ip: req.ip }));
  };

  router.get('/entries', async (req, res) => {
    const query = validate(listEntriesQuerySchema, req.query);
    const ctx = reading(req);
    await authorizeInNotebook(ctx, params(req).notebookId, 'read');
    const entries = await listEntries(ctx, { notebookId: params(req).notebookId, query });
    res.json({ entries: entries.map(presentEntrySummary) });
  });

  router.post('/entries', async (req, res) => {
    const body = validate(createEntrySchema, req.body);
    const detail = await writing(req, async (ctx) => {
      await authorizeInNotebook(ctx, params(req).notebookId, 'write');
      const { entry, head } = await createEntry(ctx, { notebookId: params(req).notebookId, ...body });
      return presentEntryDetail(entry, head, null);
    });
    res.status(201).json(detail);
  });

  router.get('/entries/:entryId', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const { head, draft } = await getEntryDetail(ctx, entry);
    res.json(presentEntryDetail(entry, head, draft));
  });

  router.put('/entries/:entryId/draft', async (req, res) => {
    const body = validate(saveDraftSchema, req.body);
    const draft = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'write' });
      return saveDraft(ctx, { entry, ...body });
    });
    res.json(presentDraft(draft));
  });

  router.delete('/entries/:entryId/draft', async (req, res) => {
    await writing(req, async (ctx) => discardDraft(ctx, await loadEntry(ctx, { ...params(req), action: 'write' })));
    res.status(204).end();
  });

  router.post('/entries/:entryId/revisions', async (req, res) => {
    const body = validate(recordRevisionSchema, req.body);
    const revision = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'write', lock: true });
      return recordRevision(ctx, { entry, ...body });
    });
    res.status(201).json(presentRevision(revision));
  });

  router.get('/entries/:entryId/revisions', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json({ revisions: (await listRevisions(ctx, entry)).map(presentRevisionSummary) });
  });

  router.get('/entries/:entryId/revisions/:revisionId', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json(presentRevision(await getRevision(ctx, entry, params(req).revisionId)));
  });

  router.post('/entries/:entryId/revisions/:revisionId/restore', async (req, res) => {
    const body = validate(restoreRevisionSchema, req.body);
    const revision = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'write', lock: true });
      return restoreRevision(ctx, { entry, revisionId: params(req).revisionId, baseRevisionId: body.baseRevisionId });
    });
    res.status(201).json(presentRevision(revision));
  });

  router.post('/entries/:entryId/cells/:cellId/run', async (req, res) => {
    const body = validate(runCellSchema, req.body);
    const { cellId } = params(req);
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'run' });
    if (!isUuid(cellId)) throw new ValidationError('A cell id is a UUID', [{ path: 'cellId', message: 'Not a UUID' }]);
    // The caller closing the request (tab closed, run cancelled) stops the run.
    const cancel = new AbortController();
    res.on('close', () => {
      if (!res.writableEnded) cancel.abort();
    });
    const output = await runCell(
      { dataSource, queue: runQueue },
      { actor: ctx.actor, entry, cellId, request: body, signal: cancel.signal },
    );
    if (output && !cancel.signal.aborted) res.json(output);
  });

  router.get('/entries/:entryId/cells/:cellId/run', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const { cellId } = params(req);
    res.json(presentRunProgress(isUuid(cellId) ? await findActiveRun(ctx.manager, { entryId: entry.id, cellId }) : null));
  });

  router.delete('/entries/:entryId/cells/:cellId/run', async (req, res) => {
    const entry = await loadEntry(reading(req), { ...params(req), action: 'run' });
    const cellId = params(req).cellId;
    if (!isUuid(cellId) || !(await cancelRun({ dataSource, queue: runQueue }, { entryId: entry.id, cellId }))) {
      throw new NotFoundError('This cell has no run in progress');
    }
    res.status(204).end();
  });

  return router;
}
