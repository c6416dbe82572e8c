import { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import type { RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { recordRevision } from './record-revision.ts';

/**
 * Restores an old revision as a new head revision (history is never rewritten): its content is
 * copied into revision n+1, which remembers where it came from. Same base check as any save;
 * the actor's working draft, if any, is kept.
 */
export async function restoreRevision(
  ctx: ActingContext,
  props: { entry: EntryEntity; revisionId: string; baseRevisionId: string },
): Promise<RevisionWithAuthor> {
  const old = await ctx.manager.findOne(RevisionEntity, { where: { id: props.revisionId, entryId: props.entry.id } });
  if (!old) throw new NotFoundError('No such revision of this entry');
  return recordRevision(ctx, {
    entry: props.entry,
    baseRevisionId: props.baseRevisionId,
    title: old.title,
    entryDate: old.entryDate,
    tags: old.tags,
    document: old.document,
    outputs: old.outputs,
    message: `Restored revision ${old.number}`,
    restoredFromId: old.id,
    // A working draft is kept: its base is now stale, so saving it later asks to rebase.
    consumeDraft: false,
    outputsVerified: true,
  });
}
