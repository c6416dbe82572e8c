import type { DataSource } from 'typeorm';
import type { Mailer } from '@server/mail/mailer.ts';
import { DEFAULT_OUTBOX_RETRY, sendDueMail, type OutboxPassResult, type OutboxRetryPolicy } from '@server/services/mail-outbox/send-due-mail.ts';

export interface MailOutboxWorkerOptions {
  /** Time between passes (default 2000 ms). */
  intervalMs?: number;
  retry?: Partial<OutboxRetryPolicy>;
}

export interface MailOutboxWorker {
  /** Runs one pass now (waits for a pass in progress first). */
  runOnce(): Promise<OutboxPassResult>;
  /** Stops polling and waits for the pass in progress. */
  stop(): Promise<void>;
}

/**
 * Sends the outbox in the background: a pass every `intervalMs`, never two at once. A failing
 * pass (database or SMTP down) is logged and tried again at the next tick; requests never wait on it.
 */
export function startMailOutboxWorker(dataSource: DataSource, mailer: Mailer, options: MailOutboxWorkerOptions = {}): MailOutboxWorker {
  const policy = { ...DEFAULT_OUTBOX_RETRY, ...options.retry };
  let current: Promise<OutboxPassResult> | null = null;
  let stopped = false;

  const pass = (): Promise<OutboxPassResult> => {
    current ??= sendDueMail(dataSource, mailer, policy).finally(() => {
      current = null;
    });
    return current;
  };
  const timer = setInterval(() => {
    if (stopped || current) return;
    pass().catch((error: Error) => console.error(`[mail-outbox] pass failed: ${error.message}`));
  }, options.intervalMs ?? 2000);
  timer.unref();

  return {
    async runOnce() {
      if (current) await current.catch(() => undefined);
      return pass();
    },
    async stop() {
      stopped = true;
      clearInterval(timer);
      if (current) await current.catch(() => undefined);
    },
  };
}
