import { CommentEntity } from '@server/entities/comment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { ConflictError, NotFoundError, ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { isUuid } from '@server/services/ids.ts';
import { authorizeOnEntry, latestReview } from '@server/services/reviews/review-access.ts';

/** Resolves (or reopens) a thread: its author, the entry's author or a PI may. */
export async function setThreadResolved(ctx: ActingContext, props: { entry: EntryEntity; commentId: string; resolved: boolean }): Promise<CommentEntity> {
  if (!isUuid(props.commentId)) throw new NotFoundError('No such comment');
  const comment = await ctx.manager.findOne(CommentEntity, { where: { id: props.commentId, entryId: props.entry.id }, lock: { mode: 'pessimistic_write' } });
  if (!comment) throw new NotFoundError('No such comment');
  await authorizeOnEntry(ctx, props.entry, 'resolve', await latestReview(ctx.manager, props.entry.id), comment.authorId);
  if (comment.parentId) throw new ValidationError('Only a thread is resolved, not a reply', [{ path: 'commentId', message: 'Resolve the first comment of the thread' }]);
  if ((comment.resolvedAt !== null) === props.resolved) {
    throw new ConflictError(props.resolved ? 'This thread is already resolved' : 'This thread is not resolved');
  }
  const before = { resolved: comment.resolvedAt !== null };
  await ctx.manager.update(CommentEntity, comment.id, props.resolved ? { resolvedAt: new Date(), resolvedById: ctx.actor.id } : { resolvedAt: null, resolvedById: null });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: props.resolved ? 'comment.resolved' : 'comment.reopened',
    entityType: 'comment',
    entityId: comment.id,
    notebookId: props.entry.notebookId,
    summary: { entryId: props.entry.id, before, after: { resolved: props.resolved } },
  });
  return ctx.manager.findOneByOrFail(CommentEntity, { id: comment.id });
}
