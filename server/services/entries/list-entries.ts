import type { ListEntriesQuery } from '@shared/api/entries.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import type { EntryWithAuthor } from '@server/presenters/entry.presenter.ts';
import type { ActingContext } from './service-context.ts';

/** `%`, `_` and `\` stand for themselves in the search box. */
function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/**
 * A notebook's entries, newest first (by entry date, then creation time), filtered by the search
 * box (title, tags, text; case-insensitive), status, author, tag (exact, case-insensitive) and an
 * inclusive date range. Run after authorizing "read" in the notebook.
 */
export async function listEntries(ctx: ActingContext, props: { notebookId: string; query: ListEntriesQuery }): Promise<EntryWithAuthor[]> {
  const { q, status, author, tag, from, to } = props.query;
  const qb = ctx.manager
    .createQueryBuilder(EntryEntity, 'entry')
    .innerJoinAndSelect('entry.author', 'author')
    .where('entry.notebook_id = :notebookId', { notebookId: props.notebookId })
    .andWhere('entry.head_revision_id IS NOT NULL');
  if (q) qb.andWhere('entry.search_text ILIKE :q', { q: likePattern(q) });
  if (status) qb.andWhere('entry.status = :status', { status });
  if (author) qb.andWhere('entry.author_id = :author', { author });
  if (tag) qb.andWhere('lower(:tag) = ANY (SELECT lower(t) FROM unnest(entry.tags) AS t)', { tag });
  if (from) qb.andWhere('entry.entry_date >= :from', { from });
  if (to) qb.andWhere('entry.entry_date <= :to', { to });
  return qb.orderBy('entry.entry_date', 'DESC').addOrderBy('entry.created_at', 'DESC').getMany();
}
