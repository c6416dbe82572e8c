import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { CellOutputs } from '@shared/cells/output.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import type { EntryEntity } from './entry.entity.ts';
import type { SignatureEntity } from './signature.entity.ts';
import type { UserEntity } from './user.entity.ts';

/**
 * One recorded state of an entry: the whole document, the cell outputs it shows, who recorded
 * it and when. Immutable: the code only inserts, and a database trigger refuses UPDATE.
 * `contentHash` = sha256 hex of canonicalJson({ title, entryDate, tags, document, outputs }).
 */
@Entity({ name: 'revision' })
export class RevisionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @ManyToOne('EntryEntity', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'entry_id' })
  entry: Relation<EntryEntity>;

  /** 1, 2, 3 … per entry. */
  @Column({ type: 'integer' })
  number: number;

  @Column({ type: 'uuid', name: 'parent_id', nullable: true })
  parentId: string | null;

  /** Set when this revision restores an older one. */
  @Column({ type: 'uuid', name: 'restored_from_id', nullable: true })
  restoredFromId: string | null;

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

  @Column({ type: 'text', nullable: true })
  message: string | null;

  @Column({ type: 'uuid', name: 'author_id' })
  authorId: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'author_id' })
  author: Relation<UserEntity>;

  @Column({ type: 'text', name: 'content_hash' })
  contentHash: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  /** Electronic signatures on this revision (loaded when presenting a whole revision). */
  @OneToMany('SignatureEntity', 'revision')
  signatures?: Relation<SignatureEntity[]>;
}
