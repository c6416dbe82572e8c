import { Router } from 'express';
import { updateNotificationsSchema } from '@shared/api/notifications.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { getPreferences, updatePreferences } from '@server/services/mail-outbox/notification-preferences.ts';
import { validate } from './pipeline.ts';

/** The caller's e-mail choices. Mounted at /api/account/notifications (see shared/api/notifications.ts). */
export function notificationsRoutes(deps: RouteDeps): Router {
  const router = Router();
  const { dataSource } = deps;
  router.use(requireUser);
  router.get('/', async (req, res) => {
    res.json({ preferences: await getPreferences(dataSource.manager, currentUser(req).id) });
  });
  router.put('/', async (req, res) => {
    const body = validate(updateNotificationsSchema, req.body);
    const preferences = await dataSource.transaction((manager) => updatePreferences({ actor: currentUser(req), manager, ip: req.ip }, body.preferences));
    res.json({ preferences });
  });
  return router;
}
