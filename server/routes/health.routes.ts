import { Router } from 'express';
import type { RouteDeps } from '@server/app-deps.ts';

/** Liveness and the reachability of the database and file storage. */
export function healthRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const database = await deps.dataSource.query('SELECT 1').then(() => 'up' as const, () => 'down' as const);
    const storage = await deps.storage.check().then(() => 'up' as const, () => 'down' as const);
    const ok = database === 'up' && storage === 'up';
    res.status(ok ? 200 : 503).json({ ok, database, storage });
  });
  return router;
}
