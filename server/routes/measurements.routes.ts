import { Router, type Request } from 'express';
import { importMeasurementsSchema } from '@shared/api/measurements.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentMeasurementSet } from '@server/presenters/measurement.presenter.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { importMeasurements, listMeasurementSets, loadMeasurementSet } from '@server/services/measurements/import-measurements.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string; setId: string };
const params = (req: Request) => req.params as Params;

/** Measured data, mounted at /api/notebooks/:notebookId/entries/:entryId/measurements (contract: shared/api/measurements.ts). */
export function measurementsRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource } = deps;
  router.use(requireUser);
  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });

  router.post('/', async (req, res) => {
    const body = validate(importMeasurementsSchema, req.body);
    const actor = currentUser(req);
    const set = await dataSource.transaction(async (manager) => {
      const ctx = { actor, manager, ip: req.ip };
      const entry = await loadEntry(ctx, { ...params(req), action: 'write' });
      return importMeasurements(ctx, { entry, input: body });
    });
    res.status(201).json(presentMeasurementSet(set));
  });

  router.get('/', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json({ sets: (await listMeasurementSets(ctx, entry)).map(presentMeasurementSet) });
  });

  router.get('/:setId', async (req, res) => {
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    res.json(presentMeasurementSet(await loadMeasurementSet(ctx, entry, params(req).setId)));
  });

  return router;
}
