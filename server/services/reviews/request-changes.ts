import { CommentEntity } from '@server/entities/comment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import type { ReviewEntity } from '@server/entities/review.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { closeReview } from './close-review.ts';
import { loadOpenReview } from './load-open-review.ts';

/** A PI sends the entry back with a comment: the review closes as "changes-requested", the comment is kept on the revision. */
export async function requestChanges(
  ctx: ActingContext,
  props: { entry: EntryEntity; revisionId: string; comment: string; publicUrl: string },
): Promise<ReviewEntity> {
  const review = await loadOpenReview(ctx, { entry: props.entry, action: 'decide', revisionId: props.revisionId });
  const comment = await ctx.manager.save(
    ctx.manager.create(CommentEntity, {
      entryId: props.entry.id,
      notebookId: props.entry.notebookId,
      parentId: null,
      revisionId: review.revisionId,
      blockIndex: null,
      cellId: null,
      kind: 'changes-requested',
      body: props.comment,
      authorId: ctx.actor.id,
      mentionIds: [],
      resolvedAt: null,
      resolvedById: null,
    }),
  );
  await closeReview(ctx, { entry: props.entry, review, status: 'changes-requested', comment: props.comment, publicUrl: props.publicUrl });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'review.changes_requested',
    entityType: 'review',
    entityId: review.id,
    notebookId: props.entry.notebookId,
    summary: {
      entryId: props.entry.id,
      revisionId: review.revisionId,
      commentId: comment.id,
      before: { status: props.entry.status },
      after: { status: 'changes-requested' },
    },
  });
  return review;
}
