import nodemailer from 'nodemailer';
import type { Env } from '@server/env.ts';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** Sends mail. The app only depends on this interface. */
export interface Mailer {
  send(message: MailMessage): Promise<void>;
  close(): void;
}

/** An SMTP mailer from the environment: the local sink by default, a real relay in production. */
export function createSmtpMailer(env: Pick<Env, 'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_SECURE' | 'SMTP_USER' | 'SMTP_PASS' | 'MAIL_FROM'>): Mailer {
  const transport = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send(message) {
      await transport.sendMail({ from: env.MAIL_FROM, ...message });
    },
    close: () => transport.close(),
  };
}

/**
 * Sends after the change it announces has committed: a failure is logged and reported
 * to the caller as `false`, never thrown (the request must not fail after the commit).
 */
export async function sendAfterCommit(mailer: Mailer, message: MailMessage): Promise<boolean> {
  try {
    await mailer.send(message);
    return true;
  } catch (error) {
    console.error(`[mail] could not send "${message.subject}" to ${message.to}: ${(error as Error).message}`);
    return false;
  }
}
