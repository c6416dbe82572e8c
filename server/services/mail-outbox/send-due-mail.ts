import type { DataSource } from 'typeorm';
import { MailMessageEntity } from '@server/entities/mail-message.entity.ts';
import type { Mailer } from '@server/mail/mailer.ts';

/** Retry schedule of the outbox: delay = min(maxDelayMs, baseDelayMs · 2^(attempts − 1)); failed after maxAttempts. */
export interface OutboxRetryPolicy {
  baseDelayMs: number;
  maxDelayMs: number;
  maxAttempts: number;
  /** Messages taken per pass. */
  batchSize: number;
}

export const DEFAULT_OUTBOX_RETRY: OutboxRetryPolicy = {
  /** 5 s after the first failure, doubling. */
  baseDelayMs: 5_000,
  /** Never wait more than 15 minutes between attempts. */
  maxDelayMs: 15 * 60_000,
  /** 12 attempts span about 2.5 hours with the defaults above. */
  maxAttempts: 12,
  batchSize: 20,
};

/** The wait before the next attempt after `attempts` failures. */
export function retryDelayMs(attempts: number, policy: Pick<OutboxRetryPolicy, 'baseDelayMs' | 'maxDelayMs'>): number {
  return Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** Math.max(0, attempts - 1));
}

export interface OutboxPassResult {
  sent: number;
  retried: number;
  failed: number;
}

/**
 * One pass of the outbox: takes due pending messages (FOR UPDATE SKIP LOCKED, so several workers
 * never send the same message), sends each, and marks it sent, or schedules a retry with backoff,
 * or marks it failed after the last attempt.
 */
export async function sendDueMail(dataSource: DataSource, mailer: Mailer, policy: OutboxRetryPolicy = DEFAULT_OUTBOX_RETRY): Promise<OutboxPassResult> {
  return dataSource.transaction(async (manager) => {
    const due = await manager
      .createQueryBuilder(MailMessageEntity, 'm')
      .where(`m.status = 'pending'`)
      .andWhere('m.next_attempt_at <= now()')
      .orderBy('m.next_attempt_at', 'ASC')
      .limit(policy.batchSize)
      .setLock('pessimistic_write')
      .setOnLocked('skip_locked')
      .getMany();
    const result: OutboxPassResult = { sent: 0, retried: 0, failed: 0 };
    for (const message of due) {
      const attempts = message.attempts + 1;
      try {
        await mailer.send({ to: message.to, subject: message.subject, text: message.text, html: message.html });
        await manager.update(MailMessageEntity, message.id, { status: 'sent', attempts, sentAt: new Date(), lastError: null });
        result.sent += 1;
      } catch (error) {
        const lastError = (error as Error).message.slice(0, 500);
        if (attempts >= policy.maxAttempts) {
          await manager.update(MailMessageEntity, message.id, { status: 'failed', attempts, lastError });
          result.failed += 1;
        } else {
          const nextAttemptAt = new Date(Date.now() + retryDelayMs(attempts, policy));
          await manager.update(MailMessageEntity, message.id, { attempts, lastError, nextAttemptAt });
          result.retried += 1;
        }
      }
    }
    return result;
  });
}
