import { Router } from 'express';
import { validateModelSchema } from '@shared/api/entries.ts';
import { requireUser } from '@server/middlewares/authenticate.ts';
import { validateModel } from '@server/services/analysis/validate-model.ts';
import { validate } from './pipeline.ts';

/** Engine helpers for any signed-in person. Mounted at /api/engine. */
export function engineRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/validate-model', (req, res) => {
    const { model } = validate(validateModelSchema, req.body);
    res.json(validateModel(model));
  });
  return router;
}
