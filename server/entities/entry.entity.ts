import { Column, Entity, JoinColumn, ManyToOne, type Relation } from 'typeorm';
import type { EntryStatus } from '@shared/api/entries.ts';
import { BaseEntity } from './base.entity.ts';
import type { NotebookEntity } from './notebook.entity.ts';
import type { UserEntity } from './user.entity.ts';

/**
 * A dated log entry of a notebook. Its content lives in revisions; the entry row holds what
 * the log list shows (copied from the head revision when a revision is recorded) and the
 * pointer to the head, which is what concurrent saves compare against.
 */
@Entity({ name: 'entry' })
export class EntryEntity extends BaseEntity {
  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @ManyToOne('NotebookEntity', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'notebook_id' })
  notebook: Relation<NotebookEntity>;

  /** Who created the entry. */
  @Column({ type: 'uuid', name: 'author_id' })
  authorId: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'author_id' })
  author: Relation<UserEntity>;

  @Column({ type: 'text' })
  title: string;

  /** The day the work was done (YYYY-MM-DD); pg returns a date column as this string. */
  @Column({ type: 'date', name: 'entry_date' })
  entryDate: string;

  @Column({ type: 'text', array: true, default: () => "'{}'" })
  tags: string[];

  @Column({ type: 'text', default: 'draft' })
  status: EntryStatus;

  /** The latest revision; null only inside the transaction that creates the entry. */
  @Column({ type: 'uuid', name: 'head_revision_id', nullable: true })
  headRevisionId: string | null;

  @Column({ type: 'integer', name: 'revision_count', default: 0 })
  revisionCount: number;

  /** The head revision's title, tags and document as plain text, for the search box (not loaded by default). */
  @Column({ type: 'text', name: 'search_text', default: '', select: false })
  searchText: string;
}
