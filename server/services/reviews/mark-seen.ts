import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { loadOpenReview } from './load-open-review.ts';

/** A PI notes that they have looked at `revisionId`: later changes are diffed from it. */
export async function markSeen(ctx: ActingContext, props: { entry: EntryEntity; revisionId: string }): Promise<ReviewEntity> {
  const review = await loadOpenReview(ctx, { entry: props.entry, action: 'decide' });
  const exists = await ctx.manager.exists(RevisionEntity, { where: { id: props.revisionId, entryId: props.entry.id } });
  if (!exists) throw new ValidationError('No such revision of this entry', [{ path: 'revisionId', message: 'Not a revision of this entry' }]);
  const before = review.lastSeen[ctx.actor.id]?.revisionId ?? null;
  review.lastSeen = { ...review.lastSeen, [ctx.actor.id]: { revisionId: props.revisionId, seenAt: new Date().toISOString() } };
  await ctx.manager.update(ReviewEntity, review.id, { lastSeen: review.lastSeen });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'review.seen',
    entityType: 'review',
    entityId: review.id,
    notebookId: props.entry.notebookId,
    summary: { entryId: props.entry.id, before: { lastSeenRevisionId: before }, after: { lastSeenRevisionId: props.revisionId } },
  });
  return review;
}
