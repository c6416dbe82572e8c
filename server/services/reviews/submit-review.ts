import type { SubmitReviewInput } from '@shared/api/reviews.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { ConflictError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { notify } from '@server/services/mail-outbox/enqueue-mail.ts';
import { entryLink, reviewRequestedMail } from '@server/services/mail-outbox/review-mails.ts';
import { authorizeOnEntry, latestReview, notebookPis } from './review-access.ts';

/**
 * Submits the entry's head revision for review by the notebook's PIs: opens a review (one open
 * review per entry), marks the entry "in-review", audits, and mails each PI who has not turned
 * that off. The entry must be locked by the caller. A PI's last-seen revision carries over from
 * the entry's previous review, so they can see what changed since they last looked.
 */
export async function submitReview(
  ctx: ActingContext,
  props: { entry: EntryEntity; publicUrl: string } & Required<Pick<SubmitReviewInput, 'revisionId'>> & { note: string },
): Promise<ReviewEntity> {
  const { entry } = props;
  const previous = await latestReview(ctx.manager, entry.id, true);
  await authorizeOnEntry(ctx, entry, 'submit', previous);
  if (previous?.status === 'open') throw new ConflictError('This entry is already in review; new revisions join the open review');
  if (entry.headRevisionId !== props.revisionId) {
    throw new ConflictError('Only the newest revision can be submitted; reload the entry', [{ path: 'revisionId', message: 'Not the newest revision' }]);
  }
  if (entry.status === 'approved') throw new ConflictError('The newest revision is already approved; edit the entry to start a new revision');

  const review = await ctx.manager.save(
    ctx.manager.create(ReviewEntity, {
      entryId: entry.id,
      notebookId: entry.notebookId,
      requestedById: ctx.actor.id,
      note: props.note,
      status: 'open',
      revisionId: props.revisionId,
      submittedRevisionId: props.revisionId,
      lastSeen: previous?.lastSeen ?? {},
      decidedById: null,
      closedAt: null,
    }),
  );
  await ctx.manager.update(EntryEntity, entry.id, { status: 'in-review' });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'review.submitted',
    entityType: 'review',
    entityId: review.id,
    notebookId: entry.notebookId,
    summary: { entryId: entry.id, revisionId: props.revisionId, before: { status: entry.status }, after: { status: 'in-review' }, note: props.note },
  });

  const notebook = await ctx.manager.findOneByOrFail(NotebookEntity, { id: entry.notebookId });
  for (const pi of await notebookPis(ctx.manager, entry.notebookId)) {
    if (pi.id === ctx.actor.id) continue;
    await notify(ctx.manager, {
      recipient: pi,
      kind: 'review-requested',
      message: {
        to: pi.email,
        ...reviewRequestedMail({
          piName: pi.name,
          authorName: ctx.actor.name,
          entryTitle: entry.title,
          notebookTitle: notebook.title,
          note: props.note,
          link: entryLink(props.publicUrl, entry.notebookId, entry.id),
        }),
      },
    });
  }
  return review;
}
