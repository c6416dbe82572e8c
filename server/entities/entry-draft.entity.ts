import { Column, Entity, JoinColumn, ManyToOne, Unique, type Relation } from 'typeorm';
import type { CellOutputs } from '@shared/cells/output.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import { BaseEntity } from './base.entity.ts';
import type { EntryEntity } from './entry.entity.ts';

/**
 * A person's autosaved working copy of an entry (one per person and entry), so a closed tab
 * loses nothing. It remembers the revision the edit started from; recording a revision from it
 * compares that base with the head.
 */
@Entity({ name: 'entry_draft' })
@Unique('entry_draft_entry_user_unique', ['entryId', 'userId'])
export class EntryDraftEntity extends BaseEntity {
  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @ManyToOne('EntryEntity', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'entry_id' })
  entry: Relation<EntryEntity>;

  @Column({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'uuid', name: 'base_revision_id' })
  baseRevisionId: string;

  @Column({ type: 'text' })
  title: string;

  @Column({ type: 'date', name: 'entry_date' })
  entryDate: string;

  @Column({ type: 'text', array: true })
  tags: string[];

  @Column({ type: 'jsonb' })
  document: DocumentJson;

  @Column({ type: 'jsonb' })
  outputs: CellOutputs;
}
