import type { DraftContent } from '@shared/api/entries.ts';
import { EntryDraftEntity } from '@server/entities/entry-draft.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { ValidationError } from '@server/errors/index.ts';
import { pruneOutputs } from '@server/services/revisions/prune-outputs.ts';
import type { ActingContext } from './service-context.ts';

export interface SaveDraftProps extends DraftContent {
  entry: EntryEntity;
}

/**
 * Autosaves the actor's working copy of an entry (one per person and entry; later saves replace
 * it). The base may be an older revision: the draft keeps it so that recording a revision from the
 * draft can tell whether someone else saved meanwhile. Drafts are scratch copies, not records, so
 * they are not written to the audit trail; the revision recorded from them is.
 */
export async function saveDraft(ctx: ActingContext, props: SaveDraftProps): Promise<EntryDraftEntity> {
  const base = await ctx.manager.findOne(RevisionEntity, { where: { id: props.baseRevisionId, entryId: props.entry.id }, select: { id: true } });
  if (!base) {
    throw new ValidationError('The draft must start from a revision of this entry', [
      { path: 'baseRevisionId', message: 'Not a revision of this entry' },
    ]);
  }
  const outputs = pruneOutputs(props.document, props.outputs);
  // One row per person and entry: insert, or replace the earlier autosave.
  await ctx.manager.query(
    `INSERT INTO entry_draft (entry_id, user_id, base_revision_id, title, entry_date, tags, document, outputs)
     VALUES ($1, $2, $3, $4, $5, $6, $7::jsonb, $8::jsonb)
     ON CONFLICT (entry_id, user_id) DO UPDATE SET
       base_revision_id = EXCLUDED.base_revision_id, title = EXCLUDED.title, entry_date = EXCLUDED.entry_date,
       tags = EXCLUDED.tags, document = EXCLUDED.document, outputs = EXCLUDED.outputs, updated_at = now()`,
    [
      props.entry.id,
      ctx.actor.id,
      props.baseRevisionId,
      props.title,
      props.entryDate,
      props.tags,
      JSON.stringify(props.document),
      JSON.stringify(outputs),
    ],
  );
  return ctx.manager.findOneOrFail(EntryDraftEntity, { where: { entryId: props.entry.id, userId: ctx.actor.id } });
}

/** Throws away the actor's working draft of the entry (nothing happens when there is none). */
export async function discardDraft(ctx: ActingContext, entry: EntryEntity): Promise<void> {
  await ctx.manager.delete(EntryDraftEntity, { entryId: entry.id, userId: ctx.actor.id });
}
