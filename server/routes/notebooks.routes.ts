import { Router } from 'express';
import { addMemberSchema, changeMemberRoleSchema, createNotebookSchema, updateNotebookSchema } from '@shared/api/notebooks.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { authorize } from '@server/policies/notebook.policy.ts';
import { presentMember } from '@server/presenters/member.presenter.ts';
import { presentNotebook, presentNotebookSummary } from '@server/presenters/notebook.presenter.ts';
import { addMember } from '@server/services/members/add-member.ts';
import { changeMemberRole } from '@server/services/members/change-member-role.ts';
import { listMembers } from '@server/services/members/list-members.ts';
import { removeMember } from '@server/services/members/remove-member.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { listNotebooksOf } from '@server/services/notebooks/list-notebooks.ts';
import { countMembers, loadNotebookAccess } from '@server/services/notebooks/load-notebook-access.ts';
import { updateNotebook } from '@server/services/notebooks/update-notebook.ts';
import { asUser, validate } from './pipeline.ts';

/** Notebooks the caller belongs to, and their members. Non-members get 404 for everything. */
export function notebooksRoutes(deps: RouteDeps): Router {
  const router = Router();
  const { dataSource } = deps;
  router.use(requireUser);

  router.get('/', async (req, res) => {
    const views = await listNotebooksOf(dataSource.manager, currentUser(req).id);
    res.json({ notebooks: views.map(presentNotebookSummary) });
  });

  router.post('/', async (req, res) => {
    const input = validate(createNotebookSchema, req.body);
    const view = await asUser(dataSource, req, (ctx) => createNotebook(ctx, input));
    res.status(201).json(presentNotebook(view));
  });

  router.get('/:id', async (req, res) => {
    const user = currentUser(req);
    const access = await loadNotebookAccess(dataSource.manager, req.params.id, user);
    const membership = authorize(user, 'read', access);
    res.json(presentNotebook({ notebook: access.notebook, role: membership.role, memberCount: await countMembers(dataSource.manager, access.notebook.id) }));
  });

  router.patch('/:id', async (req, res) => {
    const changes = validate(updateNotebookSchema, req.body);
    const view = await asUser(dataSource, req, async (ctx) => {
      const access = await loadNotebookAccess(ctx.manager, req.params.id, ctx.actor, true);
      const membership = authorize(ctx.actor, 'manage', access);
      const notebook = await updateNotebook(ctx, { notebook: access.notebook, changes });
      return { notebook, role: membership.role, memberCount: await countMembers(ctx.manager, notebook.id) };
    });
    res.json(presentNotebook(view));
  });

  router.get('/:id/members', async (req, res) => {
    const user = currentUser(req);
    const access = await loadNotebookAccess(dataSource.manager, req.params.id, user);
    authorize(user, 'read', access);
    res.json({ members: (await listMembers(dataSource.manager, access.notebook.id)).map(presentMember) });
  });

  router.post('/:id/members', async (req, res) => {
    const input = validate(addMemberSchema, req.body);
    const member = await asUser(dataSource, req, async (ctx) => {
      const access = await loadNotebookAccess(ctx.manager, req.params.id, ctx.actor, true);
      authorize(ctx.actor, 'manage', access);
      return addMember(ctx, { notebookId: access.notebook.id, ...input });
    });
    res.status(201).json(presentMember(member));
  });

  router.patch('/:id/members/:userId', async (req, res) => {
    const input = validate(changeMemberRoleSchema, req.body);
    const member = await asUser(dataSource, req, async (ctx) => {
      const access = await loadNotebookAccess(ctx.manager, req.params.id, ctx.actor, true);
      authorize(ctx.actor, 'manage', access);
      return changeMemberRole(ctx, { notebookId: access.notebook.id, userId: req.params.userId, role: input.role });
    });
    res.json(presentMember(member));
  });

  router.delete('/:id/members/:userId', async (req, res) => {
    await asUser(dataSource, req, async (ctx) => {
      const access = await loadNotebookAccess(ctx.manager, req.params.id, ctx.actor, true);
      authorize(ctx.actor, 'manage', access);
      await removeMember(ctx, { notebookId: access.notebook.id, userId: req.params.userId });
    });
    res.status(204).end();
  });

  return router;
}
