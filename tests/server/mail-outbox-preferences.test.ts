import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOTIFICATION_KINDS, notificationPreferencesSchema } from '@shared/api/notifications.ts';
import type { EntryDetail } from '@shared/api/entries.ts';
import { newAgent } from '../support/test-app.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { closeLogServer, demoNotebookId, logServer, paragraphDoc, signIn, startLogServer, type Client } from './entries-support.ts';

describe('notification preferences API', () => {
  let kofi: Client;
  let ines: Client;

  beforeAll(async () => {
    await startLogServer();
    [kofi, ines] = await Promise.all([signIn('researcher'), signIn('pi')]);
  });
  afterAll(async () => {
    await ines.put('/api/account/notifications', { preferences: Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, true])) });
    await closeLogServer();
  });

  it('has every kind on until the person turns it off', async () => {
    const res = await kofi.get('/api/account/notifications');
    expect(res.status).toBe(200);
    expect(notificationPreferencesSchema.parse(res.body).preferences).toEqual({ 'review-requested': true, 'review-decided': true, 'comment-reply': true, mention: true });
  });

  it('changes only the kinds given, and audits the change with before and after', async () => {
    const res = await ines.put('/api/account/notifications', { preferences: { 'review-requested': false } });
    expect(res.status).toBe(200);
    expect(res.body.preferences).toEqual({ 'review-requested': false, 'review-decided': true, 'comment-reply': true, mention: true });
    expect((await ines.get('/api/account/notifications')).body.preferences['review-requested']).toBe(false);
    const [event] = (await logServer().dataSource.query(
      `SELECT summary FROM audit_event WHERE action = 'notifications.updated' AND actor_id = $1 ORDER BY seq DESC LIMIT 1`, [(await ines.user()).id],
    )) as { summary: { before: Record<string, boolean>; after: Record<string, boolean> } }[];
    expect(event.summary.before['review-requested']).toBe(true);
    expect(event.summary.after['review-requested']).toBe(false);
  });

  it('sends no review request to a PI who turned that kind off', async () => {
    const notebook = await demoNotebookId('stirredTank');
    const entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Quiet submission', entryDate: '2026-11-29' })).body as EntryDetail;
    const rev = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/revisions`, {
      baseRevisionId: entry.head.id, title: 'Quiet submission', entryDate: '2026-11-29', tags: [], document: paragraphDoc('x'), outputs: {},
    });
    expect((await kofi.post(`/api/notebooks/${notebook}/entries/${entry.entry.id}/review`, { revisionId: rev.body.id })).status).toBe(201);
    const rows = (await logServer().dataSource.query(`SELECT 1 FROM mail_message WHERE to_address = $1 AND subject = 'Review requested: Quiet submission'`, [
      DEMO_PEOPLE.pi.email,
    ])) as unknown[];
    expect(rows).toEqual([]);
  });

  it.each([
    [{ preferences: { 'weekly-digest': false } }, 'preferences'],
    [{ preferences: { mention: 'no' } }, 'preferences.mention'],
    [{}, 'preferences'],
  ])('refuses %j naming the field', async (body, field) => {
    const res = await kofi.put('/api/account/notifications', body);
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
  });

  it('needs a signed-in person', async () => {
    const { agent } = await newAgent(logServer().app);
    expect((await agent.get('/api/account/notifications')).status).toBe(401);
  });
});
