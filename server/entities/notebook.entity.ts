import { Column, Entity, OneToMany, type Relation } from 'typeorm';
import { BaseEntity } from './base.entity.ts';
import type { MembershipEntity } from './membership.entity.ts';

/** A notebook: one study's shared log. */
@Entity({ name: 'notebook' })
export class NotebookEntity extends BaseEntity {
  @Column({ type: 'text' })
  title: string;

  @Column({ type: 'text', default: '' })
  description: string;

  @OneToMany('MembershipEntity', 'notebook')
  memberships: Relation<MembershipEntity[]>;
}
