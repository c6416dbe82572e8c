import { EntryDraftEntity } from '@server/entities/entry-draft.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import type { RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';
import { findRevisionWithAuthor } from '@server/services/revisions/record-revision.ts';
import type { ActingContext } from './service-context.ts';

/** The entry's head revision and the actor's own working draft (if any). */
export async function getEntryDetail(
  ctx: ActingContext,
  entry: EntryEntity,
): Promise<{ head: RevisionWithAuthor; draft: EntryDraftEntity | null }> {
  const head = entry.headRevisionId ? await findRevisionWithAuthor(ctx, entry.headRevisionId) : null;
  if (!head) throw new Error(`Entry ${entry.id} has no head revision`);
  const draft = await ctx.manager.findOne(EntryDraftEntity, { where: { entryId: entry.id, userId: ctx.actor.id } });
  return { head, draft };
}
