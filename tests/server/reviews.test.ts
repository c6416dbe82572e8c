import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revisionListSchema, revisionSchema, type EntryDetail, type Revision, type RunCellResponse } from '@shared/api/entries.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import { reviewDetailSchema, reviewQueueSchema, type ReviewDetail } from '@shared/api/reviews.ts';
import { startMailOutboxWorker, type MailOutboxWorker } from '@server/jobs/mail-outbox-worker.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import {
  SADDLE_BRANCH_CELL_ID,
  SADDLE_MODEL_CELL_ID,
  auditActionsFor,
  closeLogServer,
  demoNotebookId,
  logServer,
  paragraphDoc,
  saddleBranchTask,
  saddleDoc,
  saddleModel,
  signIn,
  startLogServer,
  type Client,
} from './entries-support.ts';

/** The saddle-node branch over a range of its own, so this file's runs are not stored runs other files expect to compute afresh. */
const reviewTask = { ...saddleBranchTask, bounds: { min: -1, max: 1.5 } };
function reviewDoc(note?: string): DocumentJson {
  const doc = saddleDoc(note);
  const content = (doc.content ?? []).map((node) =>
    node.attrs?.id === SADDLE_BRANCH_CELL_ID ? { ...node, attrs: { ...node.attrs, input: { modelCellId: SADDLE_MODEL_CELL_ID, task: reviewTask } } } : node,
  );
  return { ...doc, content };
}

/**
 * The review flow through the API: submit, follow new revisions, mark seen, request changes,
 * approve with an electronic signature, and every refusal on the way.
 */
describe('review API', () => {
  let kofi: Client;
  let mira: Client;
  let ines: Client;
  let jun: Client;
  let tank: string;
  let lake: string;
  let worker: MailOutboxWorker;

  beforeAll(async () => {
    const app = await startLogServer();
    worker = startMailOutboxWorker(app.dataSource, app.mailer, { intervalMs: 100 });
    [kofi, mira, ines, jun] = await Promise.all([signIn('researcher'), signIn('researcher2'), signIn('pi'), signIn('reader')]);
    tank = await demoNotebookId('stirredTank');
    lake = await demoNotebookId('shallowLake');
  });
  afterAll(async () => {
    await worker.stop();
    await closeLogServer();
  });

  const entryUrl = (nb: string, id: string) => `/api/notebooks/${nb}/entries/${id}`;
  const reviewUrl = (nb: string, id: string, action = '') => `${entryUrl(nb, id)}/review${action ? `/${action}` : ''}`;

  async function newEntry(who: Client, nb: string, title: string): Promise<EntryDetail> {
    const res = await who.post(`/api/notebooks/${nb}/entries`, { title, entryDate: '2026-11-24', tags: ['review'] });
    expect(res.status).toBe(201);
    return res.body as EntryDetail;
  }
  async function record(who: Client, nb: string, entryId: string, baseRevisionId: string, text: string, extra: Record<string, unknown> = {}): Promise<Revision> {
    const title = ((await who.get(entryUrl(nb, entryId))).body as EntryDetail).entry.title;
    const res = await who.post(`${entryUrl(nb, entryId)}/revisions`, {
      baseRevisionId, title, entryDate: '2026-11-24', tags: ['review'], document: paragraphDoc(text), outputs: {}, ...extra,
    });
    expect(res.status).toBe(201);
    return revisionSchema.parse(res.body);
  }
  /** An entry by Kofi in the stirred-tank notebook with one recorded revision, submitted for review. */
  async function submitted(note = 'Please check the branch.', title = 'Ignition branch'): Promise<{ entry: EntryDetail; rev: Revision; detail: ReviewDetail }> {
    const entry = await newEntry(kofi, tank, title);
    const rev = await record(kofi, tank, entry.entry.id, entry.head.id, 'The ignition point sits near Da = 0.12.');
    const res = await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id, note });
    expect(res.status).toBe(201);
    return { entry, rev, detail: reviewDetailSchema.parse(res.body) };
  }
  /** The message to `to` with this subject, once the outbox worker has delivered it to the SMTP sink. */
  async function delivered(to: string, subject: string) {
    const deadline = Date.now() + 10_000;
    for (;;) {
      const rows = (await logServer().dataSource.query(
        `SELECT status FROM mail_message WHERE to_address = $1 AND subject = $2 AND status = 'sent'`, [to, subject],
      )) as unknown[];
      if (rows.length > 0) {
        const dir = logServer().sink.directory;
        for (const file of readdirSync(dir).sort().reverse()) {
          const mail = await simpleParser(readFileSync(path.join(dir, file)));
          const recipients = [mail.to].flat().flatMap((a) => a?.value.map((v) => v.address) ?? []);
          if (mail.subject === subject && recipients.includes(to)) return mail;
        }
      }
      if (Date.now() > deadline) throw new Error(`No mail "${subject}" to ${to} was sent`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }
  const entryStatus = async (nb: string, id: string) => ((await kofi.get(entryUrl(nb, id))).body as EntryDetail).entry.status;

  it('submits the newest revision to the PIs: entry in review, audited, PI mailed', async () => {
    const { entry, rev, detail } = await submitted('Please check the branch.');
    expect(detail.review).toMatchObject({
      status: 'open', revisionId: rev.id, submittedRevisionId: rev.id, note: 'Please check the branch.',
      requestedBy: { name: DEMO_PEOPLE.researcher.name }, decidedBy: null, closedAt: null,
    });
    expect(detail.review.reviewers).toEqual([{ reviewer: { id: expect.any(String), name: DEMO_PEOPLE.pi.name }, lastSeenRevisionId: null, seenAt: null }]);
    expect(await entryStatus(tank, entry.entry.id)).toBe('in-review');
    expect(await auditActionsFor(entry.entry.id)).toEqual(['entry.created', 'revision.recorded', 'revision.recorded', 'review.submitted']);
    const mail = await delivered(DEMO_PEOPLE.pi.email, 'Review requested: Ignition branch');
    expect(mail.text).toContain('Kofi Mensah asks you to review "Ignition branch"');
    expect(mail.text).toContain('Please check the branch.');
    // Everyone in the notebook can read the review.
    expect((await jun.get(reviewUrl(tank, entry.entry.id))).status).toBe(200);
  });

  it('refuses to submit for a reader, a non-member, a stale revision, or twice', async () => {
    const entry = await newEntry(kofi, tank, 'Refusals');
    const rev = await record(kofi, tank, entry.entry.id, entry.head.id, 'Second revision.');
    const byReader = await jun.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id });
    expect(byReader.status).toBe(403);
    const byOutsider = await mira.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id });
    expect(byOutsider.status).toBe(404);
    const stale = await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: entry.head.id });
    expect(stale.status).toBe(409);
    expect(stale.body.error.fields).toEqual([{ path: 'revisionId', message: 'Not the newest revision' }]);
    const bad = await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: 'nope', note: 'x'.repeat(2001) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['note', 'revisionId']);
    expect((await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id })).status).toBe(201);
    const twice = await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id });
    expect(twice.status).toBe(409);
    expect(await auditActionsFor(entry.entry.id)).toEqual(['entry.created', 'revision.recorded', 'revision.recorded', 'review.submitted']);
  });

  it('follows new revisions while open; the queue and mark-seen tell the PI what changed since they looked', async () => {
    const { entry, rev } = await submitted();
    const queue1 = reviewQueueSchema.parse((await ines.get('/api/reviews/queue')).body);
    const item1 = queue1.items.find((i) => i.review.entryId === entry.entry.id);
    expect(item1).toMatchObject({ entryTitle: 'Ignition branch', notebookTitle: 'Stirred-tank ignition and extinction', lastSeenRevisionId: null, changedSinceSeen: true });

    const seen = await ines.post(reviewUrl(tank, entry.entry.id, 'mark-seen'), { revisionId: rev.id });
    expect(seen.status).toBe(200);
    expect(reviewDetailSchema.parse(seen.body).myLastSeenRevisionId).toBe(rev.id);
    const item2 = reviewQueueSchema.parse((await ines.get('/api/reviews/queue')).body).items.find((i) => i.review.entryId === entry.entry.id);
    expect(item2).toMatchObject({ lastSeenRevisionId: rev.id, changedSinceSeen: false });

    const rev3 = await record(kofi, tank, entry.entry.id, rev.id, 'Corrected: the ignition point sits near Da = 0.13.');
    const detail = reviewDetailSchema.parse((await ines.get(reviewUrl(tank, entry.entry.id))).body);
    expect(detail.review).toMatchObject({ status: 'open', revisionId: rev3.id, submittedRevisionId: rev.id });
    expect(detail.myLastSeenRevisionId).toBe(rev.id);
    expect(await entryStatus(tank, entry.entry.id)).toBe('in-review');
    const item3 = reviewQueueSchema.parse((await ines.get('/api/reviews/queue')).body).items.find((i) => i.review.entryId === entry.entry.id);
    expect(item3).toMatchObject({ lastSeenRevisionId: rev.id, changedSinceSeen: true });
    // The researcher has no queue of their own; only PIs review.
    expect(reviewQueueSchema.parse((await kofi.get('/api/reviews/queue')).body).items).toEqual([]);
    expect((await kofi.post(reviewUrl(tank, entry.entry.id, 'mark-seen'), { revisionId: rev3.id })).status).toBe(403);
    expect(await auditActionsFor(entry.entry.id)).toContain('review.seen');
  });

  it('lets only a PI who is not the author decide: a reader, a researcher and the PI author are refused', async () => {
    const { entry, rev } = await submitted();
    for (const who of [jun, kofi]) {
      expect((await who.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: 'whatever' })).status).toBe(403);
      expect((await who.post(reviewUrl(tank, entry.entry.id, 'request-changes'), { revisionId: rev.id, comment: 'No' })).status).toBe(403);
    }
    expect((await mira.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: DEMO_PEOPLE.researcher2.password })).status).toBe(404);

    // Ines writes and submits an entry of her own in the gene-switch notebook: she cannot sign it.
    const gene = await demoNotebookId('geneSwitch');
    const own = await newEntry(ines, gene, 'PI’s own entry');
    const ownRev = await record(ines, gene, own.entry.id, own.head.id, 'Written by the PI.');
    expect((await ines.post(reviewUrl(gene, own.entry.id), { revisionId: ownRev.id })).status).toBe(201);
    const self = await ines.post(reviewUrl(gene, own.entry.id, 'approve'), { revisionId: ownRev.id, password: DEMO_PEOPLE.pi.password });
    expect(self.status).toBe(403);
    expect(self.body.error.message).toBe('You cannot review or approve an entry you wrote or submitted yourself');
    expect(reviewQueueSchema.parse((await ines.get('/api/reviews/queue')).body).items.some((i) => i.review.entryId === own.entry.id)).toBe(false);
    expect(await entryStatus(tank, entry.entry.id)).toBe('in-review');
  });

  it('refuses a signature with a wrong password (401 signature_failed), audits it and signs nothing', async () => {
    const { entry, rev } = await submitted();
    const res = await ines.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: 'not-my-password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'signature_failed', fields: [{ path: 'password', message: 'Not your current password' }] });
    expect(await auditActionsFor(entry.entry.id)).toEqual(['entry.created', 'revision.recorded', 'revision.recorded', 'review.submitted', 'review.signature_failed']);
    const [event] = (await logServer().dataSource.query(
      `SELECT actor_id, summary FROM audit_event WHERE action = 'review.signature_failed' AND summary->>'entryId' = $1`, [entry.entry.id],
    )) as { actor_id: string; summary: Record<string, unknown> }[];
    expect(event.actor_id).toBe((await ines.user()).id);
    expect(event.summary).toMatchObject({ revisionId: rev.id, reason: 'wrong password' });
    expect(revisionSchema.parse((await ines.get(`${entryUrl(tank, entry.entry.id)}/revisions/${rev.id}`)).body).signatures).toEqual([]);
    expect(await entryStatus(tank, entry.entry.id)).toBe('in-review');
    // The session is still good: the PI is not signed out by a mistyped signature password.
    expect((await ines.get(reviewUrl(tank, entry.entry.id))).status).toBe(200);
    const missing = await ines.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toEqual([{ path: 'password', message: 'Enter your password to sign' }]);
  });

  it('refuses to sign a revision that is no longer the one under review (409)', async () => {
    const { entry, rev } = await submitted();
    const rev3 = await record(kofi, tank, entry.entry.id, rev.id, 'A later change.');
    const res = await ines.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: DEMO_PEOPLE.pi.password });
    expect(res.status).toBe(409);
    expect(res.body.error.fields).toEqual([{ path: 'revisionId', message: 'Not the revision under review' }]);
    expect(rev3.signatures).toEqual([]);
  });

  it('approves with a signature: printed name, time, meaning, content hash, rerun; shown with the revision; author mailed', async () => {
    // A revision with a computed branch of x' = μ − x², so the rerun has something to reproduce.
    const entry = await newEntry(kofi, tank, 'Saddle-node check');
    const run = (await kofi.post(`${entryUrl(tank, entry.entry.id)}/cells/${SADDLE_BRANCH_CELL_ID}/run`, { model: saddleModel, task: reviewTask })).body as RunCellResponse;
    expect(run.status).toBe('ok');
    const rev = await record(kofi, tank, entry.entry.id, entry.head.id, '', { document: reviewDoc(), outputs: { [SADDLE_BRANCH_CELL_ID]: run } });
    expect((await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: rev.id, note: 'Fold at μ = 0' })).status).toBe(201);

    const res = await ines.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: DEMO_PEOPLE.pi.password });
    expect(res.status).toBe(200);
    const detail = reviewDetailSchema.parse(res.body);
    expect(detail.review).toMatchObject({ status: 'approved', decidedBy: { name: DEMO_PEOPLE.pi.name } });
    expect(detail.review.closedAt).not.toBeNull();
    expect(detail.signatures).toHaveLength(1);
    const [sig] = detail.signatures;
    expect(sig).toMatchObject({ revisionId: rev.id, contentHash: rev.contentHash, printedName: 'Dr. Ines Halvorsen', meaning: 'approved', signer: { name: 'Dr. Ines Halvorsen' } });
    expect(Math.abs(Date.parse(sig.signedAt) - Date.now())).toBeLessThan(60_000);
    expect(sig.reproducibility).toMatchObject({ status: 'reproduced', differences: [], tolerance: 1e-6 });
    expect(sig.reproducibility.cells).toEqual([{ cellId: SADDLE_BRANCH_CELL_ID, kind: 'branch', status: 'reproduced', differences: [] }]);

    // Shown wherever the revision is shown.
    const shown = revisionSchema.parse((await jun.get(`${entryUrl(tank, entry.entry.id)}/revisions/${rev.id}`)).body);
    expect(shown.signatures).toEqual([sig]);
    const history = revisionListSchema.parse((await jun.get(`${entryUrl(tank, entry.entry.id)}/revisions`)).body);
    expect(history.revisions.find((r) => r.id === rev.id)?.signatures).toEqual([sig]);
    expect(history.revisions.find((r) => r.id !== rev.id)?.signatures).toEqual([]);
    const head = (await jun.get(entryUrl(tank, entry.entry.id))).body as EntryDetail;
    expect(head.entry.status).toBe('approved');
    expect(head.head.signatures).toEqual([sig]);
    expect(await auditActionsFor(entry.entry.id)).toEqual(['entry.created', 'revision.recorded', 'cell.run', 'revision.recorded', 'review.submitted', 'review.approved']);
    const mail = await delivered(DEMO_PEOPLE.researcher.email, 'Approved: Saddle-node check');
    expect(mail.text).toContain('Dr. Ines Halvorsen approved and signed "Saddle-node check".');

    // A second approval of a closed review is refused.
    expect((await ines.post(reviewUrl(tank, entry.entry.id, 'approve'), { revisionId: rev.id, password: DEMO_PEOPLE.pi.password })).status).toBe(409);

    // Editing the approved entry starts a new draft revision; the approved one keeps its signature.
    const next = await record(kofi, tank, entry.entry.id, rev.id, '', { document: reviewDoc('Now with a note on stability.'), outputs: { [SADDLE_BRANCH_CELL_ID]: run } });
    expect(next.signatures).toEqual([]);
    expect(await entryStatus(tank, entry.entry.id)).toBe('draft');
    expect(revisionSchema.parse((await kofi.get(`${entryUrl(tank, entry.entry.id)}/revisions/${rev.id}`)).body).signatures).toEqual([sig]);
    const closed = reviewDetailSchema.parse((await kofi.get(reviewUrl(tank, entry.entry.id))).body);
    expect(closed.review).toMatchObject({ status: 'approved', revisionId: rev.id });
  });

  it('requests changes with a comment; the author is mailed and can submit again, with the PI’s last look kept', async () => {
    const { entry, rev } = await submitted('Ready', 'Extinction branch');
    expect((await ines.post(reviewUrl(tank, entry.entry.id, 'request-changes'), { revisionId: rev.id, comment: '   ' })).status).toBe(400);
    const res = await ines.post(reviewUrl(tank, entry.entry.id, 'request-changes'), { revisionId: rev.id, comment: 'Show the extinction branch too.' });
    expect(res.status).toBe(200);
    expect(reviewDetailSchema.parse(res.body).review).toMatchObject({ status: 'changes-requested', decidedBy: { name: DEMO_PEOPLE.pi.name } });
    expect(await entryStatus(tank, entry.entry.id)).toBe('changes-requested');
    const comments = (await kofi.get(`${entryUrl(tank, entry.entry.id)}/comments`)).body as { threads: { kind: string; body: string; anchor: { revisionId: string } }[] };
    expect(comments.threads).toMatchObject([{ kind: 'changes-requested', body: 'Show the extinction branch too.', anchor: { revisionId: rev.id } }]);
    const mail = await delivered(DEMO_PEOPLE.researcher.email, 'Changes requested: Extinction branch');
    expect(mail.text).toContain('Show the extinction branch too.');
    expect(await auditActionsFor(entry.entry.id)).toEqual(['entry.created', 'revision.recorded', 'revision.recorded', 'review.submitted', 'review.changes_requested']);
    // Deciding twice is refused; the closed review no longer follows revisions.
    expect((await ines.post(reviewUrl(tank, entry.entry.id, 'request-changes'), { revisionId: rev.id, comment: 'Again' })).status).toBe(409);

    const rev3 = await record(kofi, tank, entry.entry.id, rev.id, 'Both branches now.');
    expect(await entryStatus(tank, entry.entry.id)).toBe('changes-requested');
    const again = await kofi.post(reviewUrl(tank, entry.entry.id), { revisionId: rev3.id, note: 'Added the extinction branch.' });
    expect(again.status).toBe(201);
    const detail = reviewDetailSchema.parse(again.body);
    expect(detail.review).toMatchObject({ status: 'open', revisionId: rev3.id });
    // Ines last looked at the revision she sent back: the diff base for what changed.
    expect(detail.review.reviewers[0].lastSeenRevisionId).toBe(rev.id);
    expect(await entryStatus(tank, entry.entry.id)).toBe('in-review');
  });

  it('answers 404 for a review that does not exist and for entries in notebooks the caller is not in', async () => {
    const entry = await newEntry(mira, lake, 'Turbid state');
    expect((await mira.get(reviewUrl(lake, entry.entry.id))).status).toBe(404);
    expect((await kofi.get(reviewUrl(lake, entry.entry.id))).status).toBe(404);
    expect((await kofi.post(reviewUrl(lake, entry.entry.id), { revisionId: entry.head.id })).status).toBe(404);
    expect((await ines.post(reviewUrl(lake, entry.entry.id, 'mark-seen'), { revisionId: entry.head.id })).status).toBe(404);
  });
});
