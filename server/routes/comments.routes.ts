import { Router, type Request } from 'express';
import { createCommentSchema, listCommentsQuerySchema } from '@shared/api/reviews.ts';
import type { RouteDeps } from '@server/app-deps.ts';
import { CommentEntity } from '@server/entities/comment.entity.ts';
import { currentUser, requireUser } from '@server/middlewares/authenticate.ts';
import { presentComment, presentThreads } from '@server/presenters/comment.presenter.ts';
import { createComment } from '@server/services/comments/create-comment.ts';
import { listComments } from '@server/services/comments/list-comments.ts';
import { setThreadResolved } from '@server/services/comments/resolve-comment.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { validate } from './pipeline.ts';

type Params = { notebookId: string; entryId: string; commentId: string };
const params = (req: Request) => req.params as Params;

/** Comments on an entry. Mounted at /api/notebooks/:notebookId/entries/:entryId/comments (see shared/api/reviews.ts). */
export function commentsRoutes(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  const { dataSource } = deps;
  router.use(requireUser);

  const reading = (req: Request): ActingContext => ({ actor: currentUser(req), manager: dataSource.manager, ip: req.ip });
  const writing = <T>(req: Request, work: (ctx: ActingContext) => Promise<T>): Promise<T> =>
    dataSource.transaction((manager) => work({ actor: currentUser(req), manager, ip: req.ip }));

  /** One comment as the API shows it (after the change committed). */
  async function present(req: Request, id: string) {
    const ctx = reading(req);
    const comment = await ctx.manager.findOneOrFail(CommentEntity, { where: { id }, relations: { author: true, resolvedBy: true } });
    const { people } = await listComments(ctx, { entry: await loadEntry(ctx, { ...params(req), action: 'read' }), revisionId: comment.revisionId });
    return presentComment(comment, people);
  }

  router.get('/', async (req, res) => {
    const query = validate(listCommentsQuerySchema, req.query);
    const ctx = reading(req);
    const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
    const { comments, people } = await listComments(ctx, { entry, revisionId: query.revisionId });
    res.json({ threads: presentThreads(comments, people) });
  });

  router.post('/', async (req, res) => {
    const body = validate(createCommentSchema, req.body);
    const comment = await writing(req, async (ctx) => {
      const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
      return createComment(ctx, { entry, anchor: body.anchor, body: body.body, parentId: body.parentId, publicUrl: deps.env.PUBLIC_URL });
    });
    res.status(201).json(await present(req, comment.id));
  });

  for (const [path, resolved] of [['/:commentId/resolve', true], ['/:commentId/reopen', false]] as const) {
    router.post(path, async (req, res) => {
      const comment = await writing(req, async (ctx) => {
        const entry = await loadEntry(ctx, { ...params(req), action: 'read' });
        return setThreadResolved(ctx, { entry, commentId: params(req).commentId, resolved });
      });
      res.json(await present(req, comment.id));
    });
  }

  return router;
}
