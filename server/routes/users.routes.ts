import { Router } from 'express';
import { changePasswordSchema, updateAccountSchema, updateUserSchema } from '@shared/api/users.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { authorizeSite } from '@server/policies/site.policy.ts';
import { presentUser } from '@server/presenters/user.presenter.ts';
import { changePassword } from '@server/services/auth/change-password.ts';
import { listUsers } from '@server/services/users/list-users.ts';
import { updateUser } from '@server/services/users/update-user.ts';
import { asUser, validate } from './pipeline.ts';

/** People, for administrators. */
export function usersRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    authorizeSite(req.user, 'administer');
    res.json({ users: (await listUsers(deps.dataSource.manager)).map(presentUser) });
  });

  router.patch('/:id', async (req, res) => {
    authorizeSite(req.user, 'administer');
    const changes = validate(updateUserSchema, req.body);
    const user = await asUser(deps.dataSource, req, (ctx) => updateUser(ctx, { userId: req.params.id, changes }));
    res.json(presentUser(user));
  });

  return router;
}

/** The signed-in person's own account. */
export function accountRoutes(deps: RouteDeps): Router {
  const router = Router();
  router.use(requireUser);

  router.patch('/', async (req, res) => {
    const changes = validate(updateAccountSchema, req.body);
    const user = await asUser(deps.dataSource, req, (ctx) => updateUser(ctx, { userId: currentUser(req).id, changes }));
    res.json(presentUser(user));
  });

  router.post('/password', async (req, res) => {
    const input = validate(changePasswordSchema, req.body);
    await asUser(deps.dataSource, req, (ctx) => changePassword(ctx, { ...input, keepSid: req.sessionID }));
    res.status(204).end();
  });

  return router;
}
