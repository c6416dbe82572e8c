import { Router, type Request } from 'express';
import { ATTACHMENT_LIMITS } from '@shared/api/attachments.ts';
import { attachFigureSchema } from '@shared/api/figures.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentFigure } from '@server/presenters/figure.presenter.ts';
import { StorageUnavailableError } from '@server/services/attachments/upload-errors.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { attachFigure, listFigures, loadFigure } from '@server/services/figures/attach-figure.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string; figureId: string; format: string };
const params = (req: Request) => req.params as Params;

/** Figures of an entry, mounted at /api/notebooks/:notebookId/entries/:entryId/figures (contract: shared/api/figures.ts). */
export function figuresRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource, storage } = deps;
  router.use(requireUser);
  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });

  router.post('/', async (req, res) => {
    const body = validate(attachFigureSchema, req.body);
    const entry = await loadEntry(reading(req), { ...params(req), action: 'write' });
    const figure = await attachFigure({ dataSource, storage }, { actor: currentUser(req), entry, input: body });
    res.status(201).json(presentFigure(figure));
  });

  router.get('/', async (req, res) => {
    const entry = await loadEntry(reading(req), { ...params(req), action: 'read' });
    res.json({ figures: (await listFigures(dataSource.manager, entry)).map(presentFigure) });
  });

  router.get('/:figureId', async (req, res) => {
    const entry = await loadEntry(reading(req), { ...params(req), action: 'read' });
    res.json(presentFigure(await loadFigure(dataSource.manager, entry, params(req).figureId)));
  });

  router.get('/:figureId/:format', async (req, res) => {
    const entry = await loadEntry(reading(req), { ...params(req), action: 'read' });
    const figure = await loadFigure(dataSource.manager, entry, params(req).figureId);
    const format = params(req).format;
    if (format !== 'svg' && format !== 'png') {
      res.status(404).json({ error: { code: 'not_found', message: 'A figure comes as svg or png' } });
      return;
    }
    const url = await storage.signedUrl(format === 'svg' ? figure.svgKey : figure.pngKey, ATTACHMENT_LIMITS.signedUrlSeconds).catch(() => {
      throw new StorageUnavailableError('File storage is not reachable right now; try again in a moment.');
    });
    res.setHeader('Cache-Control', 'private, no-store');
    res.redirect(302, url);
  });

  return router;
}
