import type { ReviewStatus } from '@shared/api/reviews.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { notify } from '@server/services/mail-outbox/enqueue-mail.ts';
import { entryLink, reviewDecidedMail } from '@server/services/mail-outbox/review-mails.ts';

/**
 * Closes an open review with a decision: the review and the entry take the decided status, the
 * deciding PI's last-seen moves to the decided revision, and the entry's author (and the submitter,
 * if someone else) is mailed unless they turned that kind off.
 */
export async function closeReview(
  ctx: ActingContext,
  props: { entry: EntryEntity; review: ReviewEntity; status: Exclude<ReviewStatus, 'open'>; comment?: string; reproduced?: boolean; publicUrl: string },
): Promise<void> {
  const { entry, review } = props;
  const lastSeen = { ...review.lastSeen, [ctx.actor.id]: { revisionId: review.revisionId, seenAt: new Date().toISOString() } };
  await ctx.manager.update(ReviewEntity, review.id, { status: props.status, decidedById: ctx.actor.id, closedAt: new Date(), lastSeen });
  await ctx.manager.update(EntryEntity, entry.id, { status: props.status });

  const recipients = [...new Set([entry.authorId, review.requestedById])].filter((id) => id !== ctx.actor.id);
  for (const id of recipients) {
    const person = await ctx.manager.findOneBy(UserEntity, { id });
    if (!person?.active) continue;
    await notify(ctx.manager, {
      recipient: person,
      kind: 'review-decided',
      message: {
        to: person.email,
        ...reviewDecidedMail({
          authorName: person.name,
          piName: ctx.actor.name,
          entryTitle: entry.title,
          decision: props.status,
          comment: props.comment,
          reproduced: props.reproduced,
          link: entryLink(props.publicUrl, entry.notebookId, entry.id),
        }),
      },
    });
  }
}
