import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { AttachmentType } from '@shared/api/attachments.ts';
import type { UserEntity } from './user.entity.ts';

/**
 * A file attached to an entry. The bytes live in file storage under `storageKey`
 * (notebooks/<nid>/entries/<eid>/attachments/<uuid>); the original name is kept here only.
 * The row is inserted after the object is stored. Removal marks the row; the object stays so
 * that a recorded revision that showed it can still be read.
 */
@Entity({ name: 'attachment' })
export class AttachmentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'uuid', name: 'uploaded_by_id' })
  uploadedById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'uploaded_by_id' })
  uploadedBy: Relation<UserEntity>;

  @Column({ type: 'text', name: 'storage_key' })
  storageKey: string;

  @Column({ type: 'text', name: 'original_name' })
  originalName: string;

  @Column({ type: 'text', name: 'content_type' })
  contentType: AttachmentType;

  @Column({ type: 'integer', name: 'byte_size' })
  byteSize: number;

  @Column({ type: 'text' })
  sha256: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @Column({ type: 'timestamptz', name: 'removed_at', nullable: true })
  removedAt: Date | null;
}
