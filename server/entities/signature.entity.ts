import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ReproducibilityReport, SignatureMeaning } from '@shared/api/reviews.ts';
import type { RevisionEntity } from './revision.entity.ts';
import type { UserEntity } from './user.entity.ts';

/**
 * An electronic signature on one revision (21 CFR Part 11 §11.50: printed name, date and time,
 * meaning). Bound to the revision's content by a foreign key on (revision_id, content_hash), so it
 * cannot point at another revision (§11.70); the database refuses UPDATE and DELETE.
 */
@Entity({ name: 'signature' })
export class SignatureEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'revision_id' })
  revisionId: string;

  @ManyToOne('RevisionEntity', 'signatures')
  @JoinColumn({ name: 'revision_id' })
  revision: Relation<RevisionEntity>;

  @Column({ type: 'text', name: 'content_hash' })
  contentHash: string;

  @Column({ type: 'uuid', name: 'review_id', nullable: true })
  reviewId: string | null;

  @Column({ type: 'uuid', name: 'signer_id' })
  signerId: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'signer_id' })
  signer: Relation<UserEntity>;

  /** The signer's name as it stood when they signed. */
  @Column({ type: 'text', name: 'printed_name' })
  printedName: string;

  @Column({ type: 'text' })
  meaning: SignatureMeaning;

  @Column({ type: 'timestamptz', name: 'signed_at' })
  signedAt: Date;

  /** The rerun of the revision's cells made just before signing. */
  @Column({ type: 'jsonb' })
  reproducibility: ReproducibilityReport;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
