import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { commentListSchema, commentSchema, type Comment } from '@shared/api/reviews.ts';
import type { EntryDetail } from '@shared/api/entries.ts';
import { startMailOutboxWorker, type MailOutboxWorker } from '@server/jobs/mail-outbox-worker.ts';
import { findMentions } from '@server/services/comments/mentions.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { SADDLE_BRANCH_CELL_ID, auditActionsFor, closeLogServer, demoNotebookId, logServer, saddleDoc, signIn, startLogServer, type Client } from './entries-support.ts';

describe('comments API', () => {
  let kofi: Client;
  let ines: Client;
  let jun: Client;
  let mira: Client;
  let notebook: string;
  let entry: EntryDetail;
  let revisionId: string;
  let worker: MailOutboxWorker;

  beforeAll(async () => {
    const app = await startLogServer();
    worker = startMailOutboxWorker(app.dataSource, app.mailer, { intervalMs: 100 });
    [kofi, ines, jun, mira] = await Promise.all([signIn('researcher'), signIn('pi'), signIn('reader'), signIn('researcher2')]);
    notebook = await demoNotebookId('stirredTank');
    entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Jacket temperature sweep', entryDate: '2026-11-26' })).body as EntryDetail;
    const rev = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Jacket temperature sweep', entryDate: '2026-11-26', tags: [], document: saddleDoc(), outputs: {},
    });
    revisionId = rev.body.id as string;
  });
  afterAll(async () => {
    await worker.stop();
    await closeLogServer();
  });

  const url = (suffix = '') => `/api/notebooks/${notebook}/entries/${entry.entry.id}/comments${suffix}`;

  /** Mail to `to` whose subject is `subject`, once the outbox worker has delivered it to the sink. */
  async function delivered(to: string, subject: string) {
    const deadline = Date.now() + 10_000;
    const dir = logServer().sink.directory;
    while (Date.now() < deadline) {
      for (const file of readdirSync(dir)) {
        const mail = await simpleParser(readFileSync(path.join(dir, file)));
        const recipients = [mail.to].flat().flatMap((a) => a?.value.map((v) => v.address) ?? []);
        if (mail.subject === subject && recipients.includes(to)) return mail;
      }
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`No mail "${subject}" to ${to}`);
  }

  it('lets every member comment on a block or a cell, readers included; threads list replies under their comment', async () => {
    const onBlock = await jun.post(url(), { anchor: { revisionId, blockIndex: 0 }, body: 'Is the note about the right model?' });
    expect(onBlock.status).toBe(201);
    const thread = commentSchema.parse(onBlock.body);
    expect(thread).toMatchObject({ parentId: null, kind: 'comment', anchor: { revisionId, blockIndex: 0 }, author: { name: DEMO_PEOPLE.reader.name }, resolvedAt: null });

    const onCell = await ines.post(url(), { anchor: { revisionId, cellId: SADDLE_BRANCH_CELL_ID }, body: 'Widen the bounds a little.' });
    expect(onCell.status).toBe(201);
    const reply = await kofi.post(url(), { anchor: { revisionId, blockIndex: 0 }, parentId: thread.id, body: 'Yes, it is the normal form.' });
    expect(reply.status).toBe(201);
    // A reply to a reply joins the same thread.
    const nested = await jun.post(url(), { anchor: { revisionId, blockIndex: 0 }, parentId: reply.body.id, body: 'Thanks.' });
    expect(commentSchema.parse(nested.body).parentId).toBe(thread.id);

    const list = commentListSchema.parse((await kofi.get(url())).body);
    const mine = list.threads.find((t) => t.id === thread.id);
    expect(mine?.replies.map((r: Comment) => r.body)).toEqual(['Yes, it is the normal form.', 'Thanks.']);
    expect(list.threads.find((t) => t.anchor.cellId === SADDLE_BRANCH_CELL_ID)?.body).toBe('Widen the bounds a little.');
    expect((await auditActionsFor(entry.entry.id)).filter((a) => a === 'comment.created')).toHaveLength(4);
    // The replied-to reader hears about the reply.
    const mail = await delivered(DEMO_PEOPLE.reader.email, 'Kofi Mensah replied on Jacket temperature sweep');
    expect(mail.text).toContain('Yes, it is the normal form.');
  });

  it.each([
    [{ anchor: { revisionId: '00000000-0000-4000-8000-000000000000' }, body: 'x' }, 'anchor.revisionId'],
    [{ anchor: { revisionId: 'REV', blockIndex: 99 }, body: 'x' }, 'anchor.blockIndex'],
    [{ anchor: { revisionId: 'REV', blockIndex: -1 }, body: 'x' }, 'anchor.blockIndex'],
    [{ anchor: { revisionId: 'REV', cellId: 'no-such-cell' }, body: 'x' }, 'anchor.cellId'],
    [{ anchor: { revisionId: 'REV' }, body: '   ' }, 'body'],
    [{ anchor: { revisionId: 'REV' }, body: 'x'.repeat(5001) }, 'body'],
    [{ anchor: { revisionId: 'REV' }, body: 'x', parentId: '00000000-0000-4000-8000-000000000000' }, 'parentId'],
  ])('refuses a bad comment %j naming the field', async (body, field) => {
    const res = await kofi.post(url(), JSON.parse(JSON.stringify(body).replace('"REV"', JSON.stringify(revisionId))));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
  });

  it('keeps non-members out', async () => {
    expect((await mira.get(url())).status).toBe(404);
    expect((await mira.post(url(), { anchor: { revisionId }, body: 'Hello' })).status).toBe(404);
  });

  it('mails a mentioned member, with or without the title in the name, unless they turned mentions off', async () => {
    const res = await kofi.post(url(), { anchor: { revisionId }, body: '@Ines Halvorsen could you check the fold? cc @Jun Okafor' });
    expect(res.status).toBe(201);
    expect(commentSchema.parse(res.body).mentions.map((m) => m.name).sort()).toEqual([DEMO_PEOPLE.pi.name, DEMO_PEOPLE.reader.name].sort());
    await delivered(DEMO_PEOPLE.pi.email, 'Kofi Mensah mentioned you on Jacket temperature sweep');

    expect((await jun.put('/api/account/notifications', { preferences: { mention: false } })).body.preferences).toMatchObject({ mention: false, 'comment-reply': true });
    const again = await kofi.post(url(), { anchor: { revisionId }, body: 'Second ping for @Jun Okafor.' });
    expect(commentSchema.parse(again.body).mentions.map((m) => m.name)).toEqual([DEMO_PEOPLE.reader.name]);
    const queued = (await logServer().dataSource.query(
      `SELECT count(*)::int AS n FROM mail_message WHERE to_address = $1 AND kind = 'mention' AND text LIKE '%Second ping%'`, [DEMO_PEOPLE.reader.email],
    )) as { n: number }[];
    expect(queued[0].n).toBe(0);
    await jun.put('/api/account/notifications', { preferences: { mention: true } });
  });

  it('resolves and reopens a thread (its author, the entry author or a PI), audited; replies and others are refused', async () => {
    const thread = commentSchema.parse((await ines.post(url(), { anchor: { revisionId, blockIndex: 1 }, body: 'Label the axes.' })).body);
    const reply = commentSchema.parse((await jun.post(url(), { anchor: { revisionId }, parentId: thread.id, body: 'Agreed.' })).body);
    // A reader who did not start the thread cannot resolve it.
    expect((await jun.post(url(`/${thread.id}/resolve`))).status).toBe(403);
    expect((await kofi.post(url(`/${reply.id}/resolve`))).status).toBe(400);
    const resolved = await kofi.post(url(`/${thread.id}/resolve`));
    expect(resolved.status).toBe(200);
    expect(commentSchema.parse(resolved.body)).toMatchObject({ resolvedBy: { name: DEMO_PEOPLE.researcher.name } });
    expect((await kofi.post(url(`/${thread.id}/resolve`))).status).toBe(409);
    const reopened = await ines.post(url(`/${thread.id}/reopen`));
    expect(commentSchema.parse(reopened.body)).toMatchObject({ resolvedAt: null, resolvedBy: null });
    expect((await ines.post(url('/not-a-uuid/resolve'))).status).toBe(404);
    const actions = await logServer().dataSource.query(`SELECT action FROM audit_event WHERE entity_id = $1 ORDER BY seq`, [thread.id]);
    expect(actions.map((r: { action: string }) => r.action)).toEqual(['comment.created', 'comment.resolved', 'comment.reopened']);
  });
});

describe('findMentions', () => {
  const people = [
    { id: '1', name: 'Dr. Ines Halvorsen' },
    { id: '2', name: 'Kofi Mensah' },
    { id: '3', name: 'Kofi' },
  ];
  it.each([
    ['@Dr. Ines Halvorsen please look', ['1']],
    ['@ines halvorsen please look', ['1']],
    ['thanks @Kofi Mensah.', ['2', '3']],
    ['@Kofi Mensahs is not a name', ['3']],
    ['mail kofi@Kofi Mensah', []],
    ['no mention of Kofi Mensah', []],
  ])('finds mentions in %j', (body, ids) => {
    expect(findMentions(body, people).map((p) => p.id)).toEqual(ids);
  });
});
