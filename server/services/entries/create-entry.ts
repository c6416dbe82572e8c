import { emptyDocument } from '@shared/editor/document.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { recordRevision } from '@server/services/revisions/record-revision.ts';
import type { RevisionWithAuthor } from '@server/presenters/revision.presenter.ts';
import type { ActingContext } from './service-context.ts';

export interface CreateEntryProps {
  notebookId: string;
  title: string;
  entryDate: string;
  tags: string[];
}

/**
 * Creates an entry (status draft) with its first revision: an empty document. Run inside a
 * transaction, after authorizing "write" in the notebook.
 */
export async function createEntry(ctx: ActingContext, props: CreateEntryProps): Promise<{ entry: EntryEntity; head: RevisionWithAuthor }> {
  const created = ctx.manager.create(EntryEntity, {
    notebookId: props.notebookId,
    authorId: ctx.actor.id,
    title: props.title,
    entryDate: props.entryDate,
    tags: props.tags,
    status: 'draft',
    headRevisionId: null,
    revisionCount: 0,
    searchText: '',
  });
  await ctx.manager.insert(EntryEntity, created);
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'entry.created',
    entityType: 'entry',
    entityId: created.id,
    notebookId: props.notebookId,
    summary: { title: props.title, entryDate: props.entryDate },
  });
  const head = await recordRevision(ctx, {
    entry: created,
    baseRevisionId: null,
    title: props.title,
    entryDate: props.entryDate,
    tags: props.tags,
    document: emptyDocument(),
    outputs: {},
    message: 'Entry created',
  });
  const entry = await ctx.manager.findOneOrFail(EntryEntity, { where: { id: created.id }, relations: { author: true } });
  return { entry, head };
}
