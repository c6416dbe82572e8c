import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { NotificationKind } from '@shared/api/notifications.ts';

/** A person's choice for one kind of e-mail. No row means the kind is on. */
@Entity({ name: 'notification_preference' })
export class NotificationPreferenceEntity {
  @PrimaryColumn({ type: 'uuid', name: 'user_id' })
  userId: string;

  @PrimaryColumn({ type: 'text' })
  kind: NotificationKind;

  @Column({ type: 'boolean' })
  enabled: boolean;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;
}
