import { Column, Entity, JoinColumn, ManyToOne, type Relation } from 'typeorm';
import type { CommentKind } from '@shared/api/reviews.ts';
import { BaseEntity } from './base.entity.ts';
import type { UserEntity } from './user.entity.ts';

/** A comment on an entry, anchored to a revision and optionally one block or cell; replies share a thread. */
@Entity({ name: 'comment' })
export class CommentEntity extends BaseEntity {
  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  /** The thread's first comment; null for that first comment itself. */
  @Column({ type: 'uuid', name: 'parent_id', nullable: true })
  parentId: string | null;

  @Column({ type: 'uuid', name: 'revision_id' })
  revisionId: string;

  @Column({ type: 'integer', name: 'block_index', nullable: true })
  blockIndex: number | null;

  @Column({ type: 'text', name: 'cell_id', nullable: true })
  cellId: string | null;

  @Column({ type: 'text', default: 'comment' })
  kind: CommentKind;

  @Column({ type: 'text' })
  body: string;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'author_id' })
  author: Relation<UserEntity>;

  /** People mentioned by @Name. */
  @Column({ type: 'uuid', array: true, name: 'mention_ids', default: () => "'{}'" })
  mentionIds: string[];

  @Column({ type: 'timestamptz', name: 'resolved_at', nullable: true })
  resolvedAt: Date | null;

  @Column({ type: 'uuid', name: 'resolved_by_id', nullable: true })
  resolvedById: string | null;

  @ManyToOne('UserEntity', { nullable: true })
  @JoinColumn({ name: 'resolved_by_id' })
  resolvedBy: Relation<UserEntity> | null;
}
