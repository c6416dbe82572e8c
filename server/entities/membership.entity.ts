import { Column, Entity, JoinColumn, ManyToOne, Unique, type Relation } from 'typeorm';
import type { NotebookRole } from '@shared/domain/roles.ts';
import { BaseEntity } from './base.entity.ts';
import type { NotebookEntity } from './notebook.entity.ts';
import type { UserEntity } from './user.entity.ts';

/** A person's role in one notebook. */
@Entity({ name: 'membership' })
@Unique('membership_notebook_user_unique', ['notebookId', 'userId'])
export class MembershipEntity extends BaseEntity {
  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'text' })
  role: NotebookRole;

  @ManyToOne('NotebookEntity', 'memberships', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'notebook_id' })
  notebook: Relation<NotebookEntity>;

  @ManyToOne('UserEntity', 'memberships', { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: Relation<UserEntity>;
}
