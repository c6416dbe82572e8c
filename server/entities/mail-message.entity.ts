import { Column, Entity } from 'typeorm';
import { BaseEntity } from './base.entity.ts';

export const MAIL_STATUSES = ['pending', 'sent', 'failed'] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

/**
 * The transactional outbox: a message is inserted in the same transaction as the change it
 * announces, and the outbox worker sends it later, retrying with backoff.
 */
@Entity({ name: 'mail_message' })
export class MailMessageEntity extends BaseEntity {
  @Column({ type: 'text', name: 'to_address' })
  to: string;

  @Column({ type: 'text' })
  subject: string;

  @Column({ type: 'text' })
  text: string;

  @Column({ type: 'text' })
  html: string;

  /** What the message is about (a notification kind, or "invite" / "password-reset"). */
  @Column({ type: 'text' })
  kind: string;

  @Column({ type: 'text', default: 'pending' })
  status: MailStatus;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'timestamptz', name: 'next_attempt_at', default: () => 'now()' })
  nextAttemptAt: Date;

  @Column({ type: 'text', name: 'last_error', nullable: true })
  lastError: string | null;

  @Column({ type: 'timestamptz', name: 'sent_at', nullable: true })
  sentAt: Date | null;
}
