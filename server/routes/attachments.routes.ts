import { Router, type Request } from 'express';
import { ATTACHMENT_LIMITS } from '@shared/api/attachments.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentAttachment } from '@server/presenters/attachment.presenter.ts';
import { listAttachments, loadAttachment, removeAttachment } from '@server/services/attachments/list-attachments.ts';
import { receiveUpload } from '@server/services/attachments/receive-upload.ts';
import { storeAttachment } from '@server/services/attachments/store-attachment.ts';
import { StorageUnavailableError } from '@server/services/attachments/upload-errors.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

type Params = { notebookId: string; entryId: string; attachmentId: string };
const params = (req: Request) => req.params as Params;

/** Files on an entry, mounted at /api/notebooks/:notebookId/entries/:entryId/attachments (contract: shared/api/attachments.ts). */
export function attachmentsRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource, storage } = deps;
  router.use(requireUser);
  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });

  router.post('/', async (req, res) => {
    const entry = await loadEntry(reading(req), { ...params(req), action: 'write' });
    const file = await receiveUpload(req);
    const row = await storeAttachment({ dataSource, storage }, { actor: currentUser(req), entry, file });
    res.status(201).json(presentAttachment(row));
  });

  router.get('/', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json({ attachments: (await listAttachments(ctx, entry)).map(presentAttachment) });
  });

  router.get('/:attachmentId', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json(presentAttachment(await loadAttachment(ctx, entry, params(req).attachmentId)));
  });

  router.get('/:attachmentId/content', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const row = await loadAttachment(ctx, entry, params(req).attachmentId);
    const url = await storage.signedUrl(row.storageKey, ATTACHMENT_LIMITS.signedUrlSeconds).catch(() => {
      throw new StorageUnavailableError('File storage is not reachable right now; try the download again in a moment.');
    });
    res.setHeader('Cache-Control', 'private, no-store');
    res.redirect(302, url);
  });

  router.delete('/:attachmentId', async (req, res) => {
    const actor = currentUser(req);
    await dataSource.transaction(async (manager) => {
      const ctx = { actor, manager, ip: req.ip };
      const entry = await loadEntry(ctx, { ...params(req), action: 'write' });
      await removeAttachment(ctx, entry, params(req).attachmentId);
    });
    res.status(204).end();
  });

  return router;
}
