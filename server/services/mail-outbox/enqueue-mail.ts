import type { EntityManager } from 'typeorm';
import type { NotificationKind } from '@shared/api/notifications.ts';
import { MailMessageEntity } from '@server/entities/mail-message.entity.ts';
import type { MailMessage } from '@server/mail/mailer.ts';
import { wantsMail } from './notification-preferences.ts';

/**
 * Puts a message in the outbox inside the caller's transaction, so it is sent exactly when the
 * change it announces commits (the outbox worker sends it; a down SMTP server only delays it).
 */
export async function enqueueMail(manager: EntityManager, props: { kind: string; message: MailMessage }): Promise<MailMessageEntity> {
  if (!manager.queryRunner?.isTransactionActive) throw new Error('enqueueMail must run inside a transaction');
  const row = manager.create(MailMessageEntity, {
    to: props.message.to,
    subject: props.message.subject,
    text: props.message.text,
    html: props.message.html,
    kind: props.kind,
    status: 'pending',
    attempts: 0,
    nextAttemptAt: new Date(),
    lastError: null,
    sentAt: null,
  });
  return manager.save(row);
}

/** A notification to one person: enqueued unless they turned this kind off. Returns whether it was. */
export async function notify(
  manager: EntityManager,
  props: { recipient: { id: string; email: string }; kind: NotificationKind; message: MailMessage },
): Promise<boolean> {
  if (!(await wantsMail(manager, props.recipient.id, props.kind))) return false;
  await enqueueMail(manager, { kind: props.kind, message: { ...props.message, to: props.recipient.email } });
  return true;
}
