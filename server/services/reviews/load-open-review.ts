import type { ReviewEntity } from '@server/entities/review.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { ConflictError, NotFoundError } from '@server/errors/index.ts';
import type { ReviewAction } from '@server/policies/review.policy.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { authorizeOnEntry, latestReview } from './review-access.ts';

/**
 * The entry's open review (locked), after checking the actor may do `action` on it, and that the
 * revision they acted on is still the one under review (else 409: reload and look again).
 */
export async function loadOpenReview(
  ctx: ActingContext,
  props: { entry: EntryEntity; action: ReviewAction; revisionId?: string },
): Promise<ReviewEntity> {
  const review = await latestReview(ctx.manager, props.entry.id, true);
  await authorizeOnEntry(ctx, props.entry, props.action, review);
  if (!review) throw new NotFoundError('This entry has not been submitted for review');
  if (review.status !== 'open') throw new ConflictError(`This review is closed (${review.status}); the entry must be submitted again`);
  if (props.revisionId !== undefined && props.revisionId !== review.revisionId) {
    throw new ConflictError('The entry has a newer revision than the one you reviewed; look at the changes first', [
      { path: 'revisionId', message: 'Not the revision under review' },
    ]);
  }
  return review;
}
