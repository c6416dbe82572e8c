import { Column, Entity, JoinColumn, ManyToOne, type Relation } from 'typeorm';
import type { SiteRole } from '@shared/domain/roles.ts';
import { BaseEntity } from './base.entity.ts';
import type { UserEntity } from './user.entity.ts';

/** An invitation by e-mail. Only the SHA-256 of the link token is stored. */
@Entity({ name: 'invite' })
export class InviteEntity extends BaseEntity {
  @Column({ type: 'text' })
  email: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', name: 'site_role' })
  siteRole: SiteRole;

  @Column({ type: 'text', name: 'token_hash', unique: true })
  tokenHash: string;

  @Column({ type: 'uuid', name: 'invited_by_id' })
  invitedById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'invited_by_id' })
  invitedBy: Relation<UserEntity>;

  @Column({ type: 'timestamptz', name: 'expires_at' })
  expiresAt: Date;

  @Column({ type: 'timestamptz', name: 'accepted_at', nullable: true })
  acceptedAt: Date | null;
}
