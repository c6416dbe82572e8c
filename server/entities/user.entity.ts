import { Column, Entity, OneToMany, type Relation } from 'typeorm';
import type { SiteRole } from '@shared/domain/roles.ts';
import { BaseEntity } from './base.entity.ts';
import type { MembershipEntity } from './membership.entity.ts';

@Entity({ name: 'app_user' })
export class UserEntity extends BaseEntity {
  /** Stored lower-case; unique. */
  @Column({ type: 'text', unique: true })
  email: string;

  @Column({ type: 'text' })
  name: string;

  /** argon2id hash (PHC string). */
  @Column({ type: 'text', name: 'password_hash' })
  passwordHash: string;

  @Column({ type: 'text', name: 'site_role', default: 'member' })
  siteRole: SiteRole;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @OneToMany('MembershipEntity', 'user')
  memberships: Relation<MembershipEntity[]>;
}
