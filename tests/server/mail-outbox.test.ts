import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EntryDetail } from '@shared/api/entries.ts';
import { MailMessageEntity } from '@server/entities/mail-message.entity.ts';
import { enqueueMail } from '@server/services/mail-outbox/enqueue-mail.ts';
import { retryDelayMs, sendDueMail, type OutboxRetryPolicy } from '@server/services/mail-outbox/send-due-mail.ts';
import { startMailOutboxWorker } from '@server/jobs/mail-outbox-worker.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { closeLogServer, demoNotebookId, logServer, paragraphDoc, signIn, startLogServer, type Client } from './entries-support.ts';

/** Quick retries for the tests: 20 ms doubling, at most 80 ms apart. */
const FAST: OutboxRetryPolicy = { baseDelayMs: 20, maxDelayMs: 80, maxAttempts: 50, batchSize: 50 };

describe('mail outbox', () => {
  let kofi: Client;

  beforeAll(async () => {
    await startLogServer();
    kofi = await signIn('researcher');
  });
  afterAll(closeLogServer);

  const row = (id: string) => logServer().dataSource.manager.findOneByOrFail(MailMessageEntity, { id });
  const deliveredSubjects = async () => {
    const dir = logServer().sink.directory;
    return Promise.all(readdirSync(dir).map(async (f) => (await simpleParser(readFileSync(path.join(dir, f)))).subject ?? ''));
  };
  const enqueue = (subject: string, to: string = DEMO_PEOPLE.pi.email) =>
    logServer().dataSource.transaction((manager) => enqueueMail(manager, { kind: 'review-requested', message: { to, subject, text: `${subject}\n`, html: `<p>${subject}</p>` } }));
  const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

  it('backs off exponentially up to a cap', () => {
    const policy = { baseDelayMs: 5000, maxDelayMs: 60_000 };
    expect([1, 2, 3, 4, 5, 6].map((n) => retryDelayMs(n, policy))).toEqual([5000, 10_000, 20_000, 40_000, 60_000, 60_000]);
  });

  it('keeps mail while the SMTP server is down, without blocking the request, and delivers it once the server is back', async () => {
    const app = logServer();
    await app.stopMail();

    // A change that mails the PI commits while the SMTP server is down.
    const notebook = await demoNotebookId('stirredTank');
    const entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Mail while down', entryDate: '2026-11-27' })).body as EntryDetail;
    const rev = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Mail while down', entryDate: '2026-11-27', tags: [], document: paragraphDoc('x'), outputs: {},
    });
    const submitted = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/review`, { revisionId: rev.body.id });
    expect(submitted.status).toBe(201);
    const [{ id }] = (await app.dataSource.query(`SELECT id FROM mail_message WHERE subject = 'Review requested: Mail while down'`)) as { id: string }[];
    expect(await row(id)).toMatchObject({ status: 'pending', attempts: 0, to: DEMO_PEOPLE.pi.email });

    // Every attempt fails and is rescheduled; the message stays pending.
    for (let i = 0; i < 3; i += 1) {
      await sendDueMail(app.dataSource, app.mailer, FAST);
      await wait(100);
    }
    const waiting = await row(id);
    expect(waiting.status).toBe('pending');
    expect(waiting.attempts).toBeGreaterThanOrEqual(3);
    expect(waiting.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(waiting.nextAttemptAt.getTime()).toBeGreaterThan(waiting.updatedAt.getTime() - 1000);

    // The server comes back on the same port; the running worker delivers the message.
    await app.startMail();
    const worker = startMailOutboxWorker(app.dataSource, app.mailer, { intervalMs: 50, retry: FAST });
    try {
      const deadline = Date.now() + 10_000;
      while ((await row(id)).status !== 'sent' && Date.now() < deadline) await wait(50);
    } finally {
      await worker.stop();
    }
    const sent = await row(id);
    expect(sent).toMatchObject({ status: 'sent', lastError: null });
    expect(sent.sentAt).not.toBeNull();
    expect(await deliveredSubjects()).toContain('Review requested: Mail while down');
  });

  it('gives up after the last attempt and marks the message failed', async () => {
    const app = logServer();
    const message = await enqueue('Undeliverable', 'nobody@invalid');
    const refusing = { ...app.mailer, send: () => Promise.reject(new Error('550 mailbox unavailable')) };
    for (let i = 0; i < 3; i += 1) {
      await sendDueMail(app.dataSource, refusing, { ...FAST, maxAttempts: 3 });
      await wait(100);
    }
    expect(await row(message.id)).toMatchObject({ status: 'failed', attempts: 3, lastError: '550 mailbox unavailable' });
    // A failed message is not tried again.
    await sendDueMail(app.dataSource, refusing, { ...FAST, maxAttempts: 3 });
    expect((await row(message.id)).attempts).toBe(3);
  });

  it('sends each message once when two workers pass at the same time (FOR UPDATE SKIP LOCKED)', async () => {
    const app = logServer();
    const subjects = Array.from({ length: 6 }, (_, i) => `Concurrent ${i}`);
    for (const s of subjects) await enqueue(s);
    const sent: string[] = [];
    const counting = { ...app.mailer, send: async (m: { subject: string }) => void sent.push(m.subject) };
    await Promise.all([sendDueMail(app.dataSource, counting, FAST), sendDueMail(app.dataSource, counting, FAST)]);
    expect(sent.filter((s) => s.startsWith('Concurrent')).sort()).toEqual(subjects);
  });

  it('enqueues only inside a transaction', async () => {
    await expect(enqueueMail(logServer().dataSource.manager, { kind: 'x', message: { to: 'a@b.example', subject: 's', text: 't', html: 'h' } })).rejects.toThrow(
      'enqueueMail must run inside a transaction',
    );
  });
});
