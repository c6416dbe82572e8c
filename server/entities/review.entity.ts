import { Column, Entity, JoinColumn, ManyToOne, type Relation } from 'typeorm';
import type { ReviewStatus } from '@shared/api/reviews.ts';
import { BaseEntity } from './base.entity.ts';
import type { UserEntity } from './user.entity.ts';

/** When a PI last looked at the review, and at which revision (the diff base for "what changed since"). */
export interface ReviewerSeen {
  revisionId: string;
  seenAt: string;
}

/**
 * A request that the notebook's PIs review an entry. At most one open review per entry (a partial
 * unique index). While open, `revisionId` follows the entry's newest revision.
 */
@Entity({ name: 'review' })
export class ReviewEntity extends BaseEntity {
  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'requested_by_id' })
  requestedById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'requested_by_id' })
  requestedBy: Relation<UserEntity>;

  @Column({ type: 'text', default: '' })
  note: string;

  @Column({ type: 'text', default: 'open' })
  status: ReviewStatus;

  /** The revision under review (the entry's newest while open). */
  @Column({ type: 'uuid', name: 'revision_id' })
  revisionId: string;

  @Column({ type: 'uuid', name: 'submitted_revision_id' })
  submittedRevisionId: string;

  /** Per PI (user id): the revision they last marked as seen. */
  @Column({ type: 'jsonb', name: 'last_seen', default: () => "'{}'::jsonb" })
  lastSeen: Record<string, ReviewerSeen>;

  @Column({ type: 'uuid', name: 'decided_by_id', nullable: true })
  decidedById: string | null;

  @ManyToOne('UserEntity', { nullable: true })
  @JoinColumn({ name: 'decided_by_id' })
  decidedBy: Relation<UserEntity> | null;

  @Column({ type: 'timestamptz', name: 'closed_at', nullable: true })
  closedAt: Date | null;
}
