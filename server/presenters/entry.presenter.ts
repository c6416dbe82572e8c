import type { Draft, EntryDetail, EntrySummary } from '@shared/api/entries.ts';
import type { EntryDraftEntity } from '@server/entities/entry-draft.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { presentRevision, type RevisionWithAuthor } from './revision.presenter.ts';

/** An entry with its author loaded (and, by then, always a head revision). */
export type EntryWithAuthor = EntryEntity & { author: { id: string; name: string } };

export function presentEntrySummary(e: EntryWithAuthor): EntrySummary {
  return {
    id: e.id,
    notebookId: e.notebookId,
    title: e.title,
    entryDate: e.entryDate,
    tags: e.tags,
    status: e.status,
    author: { id: e.author.id, name: e.author.name },
    createdAt: e.createdAt.toISOString(),
    updatedAt: e.updatedAt.toISOString(),
    headRevisionId: e.headRevisionId ?? '',
    revisionCount: e.revisionCount,
  };
}

export function presentDraft(d: EntryDraftEntity): Draft {
  return {
    baseRevisionId: d.baseRevisionId,
    title: d.title,
    entryDate: d.entryDate,
    tags: d.tags,
    document: d.document,
    outputs: d.outputs,
    updatedAt: d.updatedAt.toISOString(),
  };
}

export function presentEntryDetail(e: EntryWithAuthor, head: RevisionWithAuthor, draft: EntryDraftEntity | null): EntryDetail {
  return { entry: presentEntrySummary(e), head: presentRevision(head), draft: draft ? presentDraft(draft) : null };
}
