import { Router } from 'express';
import { searchQuerySchema } from '@shared/api/search.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { searchEntries } from '@server/services/search/search-entries.ts';
import { validate } from './pipeline.ts';

/** Search across the caller's notebooks, mounted at /api/search (contract: shared/api/search.ts). */
export function searchRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    const query = validate(searchQuerySchema, req.query);
    const results = await searchEntries({ actor: currentUser(req), manager: deps.dataSource.manager, ip: req.ip }, query);
    res.json({ results });
  });
  return router;
}
