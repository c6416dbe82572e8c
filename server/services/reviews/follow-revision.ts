import { EntryEntity } from '@server/entities/entry.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

/**
 * Called in the transaction that records a new revision of an entry: an open review follows the
 * newest revision (the PIs then see what changed since they last looked), and an approved entry
 * goes back to "draft" (the approved revision stays as it is, signed).
 */
export async function followNewRevision(ctx: ActingContext, entry: EntryEntity, revisionId: string): Promise<void> {
  await ctx.manager.update(ReviewEntity, { entryId: entry.id, status: 'open' }, { revisionId });
  if (entry.status === 'approved') await ctx.manager.update(EntryEntity, entry.id, { status: 'draft' });
}
