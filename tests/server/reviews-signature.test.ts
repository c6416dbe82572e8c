import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revisionSchema, type EntryDetail, type Revision, type RunCellResponse } from '@shared/api/entries.ts';
import { reproducibilityReportSchema, reviewDetailSchema } from '@shared/api/reviews.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import { SIGNATURE_FAILURES_PER_WINDOW } from '@server/routes/reviews.routes.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { closeLogServer, demoNotebookId, logServer, signIn, startLogServer, type Client } from './entries-support.ts';

/**
 * The signature's binding to its revision (enforced by the database) and the reproducibility
 * check made before signing. Model: x' = μ + 1/4 − x², whose one fold is at μ = −1/4, x = 0
 * (closed form: the saddle-node normal form shifted by 1/4; Strogatz, "Nonlinear Dynamics and
 * Chaos", §3.1).
 */
const MODEL_CELL = '5a1c2e3f-4b5d-4e6f-8a7b-9c0d1e2f3a4b';
const BRANCH_CELL = '6b2d3f4a-5c6e-4f70-9b8c-0d1e2f3a4b5c';
const model = { variables: [{ name: 'x', rhs: 'mu + 0.25 - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] };
const task = { kind: 'continuation', parameter: 'mu', start: { x: 1.118 }, bounds: { min: -1, max: 2 } };
const doc = (note: string): DocumentJson => ({
  type: 'doc',
  content: [
    { type: 'paragraph', content: [{ type: 'text', text: note }] },
    { type: 'cell', attrs: { id: MODEL_CELL, kind: 'model', input: { name: 'Shifted saddle-node', ...model } } },
    { type: 'cell', attrs: { id: BRANCH_CELL, kind: 'branch', input: { modelCellId: MODEL_CELL, task } } },
  ],
});

describe('signatures and the reproducibility check', () => {
  let kofi: Client;
  let ines: Client;
  let notebook: string;

  beforeAll(async () => {
    await startLogServer();
    [kofi, ines] = await Promise.all([signIn('researcher'), signIn('pi')]);
    notebook = await demoNotebookId('stirredTank');
  });
  afterAll(closeLogServer);

  const entryUrl = (id: string) => `/api/notebooks/${notebook}/entries/${id}`;

  /** A submitted entry whose branch cell output is the server's run of the cell. */
  async function submittedWithRun(title: string, tamper?: (inputHash: string) => Promise<void>): Promise<{ entryId: string; rev: Revision; run: RunCellResponse }> {
    const entry = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title, entryDate: '2026-11-25' })).body as EntryDetail;
    let run = (await kofi.post(`${entryUrl(entry.entry.id)}/cells/${BRANCH_CELL}/run`, { model, task })).body as RunCellResponse;
    expect(run.status).toBe('ok');
    if (tamper) {
      await tamper(run.inputHash);
      run = (await kofi.post(`${entryUrl(entry.entry.id)}/cells/${BRANCH_CELL}/run`, { model, task })).body as RunCellResponse;
    }
    const res = await kofi.post(`${entryUrl(entry.entry.id)}/revisions`, {
      baseRevisionId: entry.head.id, title, entryDate: '2026-11-25', tags: [], document: doc(title), outputs: { [BRANCH_CELL]: run },
    });
    expect(res.status).toBe(201);
    const rev = revisionSchema.parse(res.body);
    expect((await kofi.post(`${entryUrl(entry.entry.id)}/review`, { revisionId: rev.id })).status).toBe(201);
    return { entryId: entry.entry.id, rev, run };
  }

  it('binds a signature to its revision: the database refuses a row for another revision, a moved row and a deletion', async () => {
    const { entryId, rev } = await submittedWithRun('Bound signature');
    const signed = await ines.post(`${entryUrl(entryId)}/review/approve`, { revisionId: rev.id, password: DEMO_PEOPLE.pi.password });
    expect(signed.status).toBe(200);
    const [sig] = reviewDetailSchema.parse(signed.body).signatures;
    const db = logServer().dataSource;
    const [first] = (await db.query(`SELECT id, content_hash FROM revision WHERE entry_id = $1 AND number = 1`, [entryId])) as { id: string; content_hash: string }[];
    expect(first.content_hash).not.toBe(rev.contentHash);

    // The signed content hash with another revision's id: no such (revision, content hash) pair.
    await expect(
      db.query(
        `INSERT INTO signature (revision_id, content_hash, signer_id, printed_name, meaning, signed_at, reproducibility)
         SELECT $1, content_hash, signer_id, printed_name, meaning, signed_at, reproducibility FROM signature WHERE id = $2`,
        [first.id, sig.id],
      ),
    ).rejects.toThrow(/signature_revision_content_fk/);
    // Moving the existing signature, or changing what it says, or removing it.
    await expect(db.query(`UPDATE signature SET revision_id = $1, content_hash = $2 WHERE id = $3`, [first.id, first.content_hash, sig.id])).rejects.toThrow(/signatures are permanent: UPDATE refused/);
    await expect(db.query(`UPDATE signature SET printed_name = 'Someone else' WHERE id = $1`, [sig.id])).rejects.toThrow(/UPDATE refused/);
    await expect(db.query(`DELETE FROM signature WHERE id = $1`, [sig.id])).rejects.toThrow(/DELETE refused/);
    // One signature per signer and meaning on a revision.
    await expect(
      db.query(
        `INSERT INTO signature (revision_id, content_hash, signer_id, printed_name, meaning, signed_at, reproducibility)
         SELECT revision_id, content_hash, signer_id, printed_name, meaning, now(), reproducibility FROM signature WHERE id = $1`,
        [sig.id],
      ),
    ).rejects.toThrow(/signature_once_per_signer/);
    const shown = revisionSchema.parse((await kofi.get(`${entryUrl(entryId)}/revisions/${rev.id}`)).body);
    expect(shown.signatures).toEqual([sig]);
  });

  it('shows the PI "reproduced" before signing when the rerun matches the stored branch', async () => {
    const { entryId } = await submittedWithRun('Reproduced branch');
    const res = await ines.get(`${entryUrl(entryId)}/review/reproducibility`);
    expect(res.status).toBe(200);
    const report = reproducibilityReportSchema.parse(res.body);
    expect(report).toMatchObject({ status: 'reproduced', differences: [], tolerance: 1e-6 });
    expect(report.cells).toEqual([{ cellId: BRANCH_CELL, kind: 'branch', status: 'reproduced', differences: [] }]);
    // Researchers do not trigger reruns for review.
    expect((await kofi.get(`${entryUrl(entryId)}/review/reproducibility`)).status).toBe(403);

    // The rerun went through the run queue as a run of its own kind, in the PI's name, computed
    // afresh although the store holds the result; like the check always did, it stored no
    // cell.run event (only the researcher's runs have them).
    const db = logServer().dataSource;
    const reruns = await db.query(
      `SELECT r.status, u.email, r.output->>'cached' AS cached FROM analysis_run r JOIN app_user u ON u.id = r.started_by_id
       WHERE r.entry_id = $1 AND r.cell_id = $2 AND r.purpose = 'reproducibility'`,
      [entryId, BRANCH_CELL],
    );
    expect(reruns).toEqual([{ status: 'finished', email: DEMO_PEOPLE.pi.email, cached: 'false' }]);
    const events = (await db.query(`SELECT actor_id FROM audit_event WHERE action = 'cell.run' AND entity_id = $1 AND summary->>'entryId' = $2`, [BRANCH_CELL, entryId])) as unknown[];
    const researcherRuns = (await db.query(`SELECT 1 FROM analysis_run WHERE entry_id = $1 AND cell_id = $2 AND purpose = 'cell'`, [entryId, BRANCH_CELL])) as unknown[];
    expect(events).toHaveLength(researcherRuns.length);
  });

  it('reruns a cell while the researcher\'s own run of it is in progress, neither run ending the other', async () => {
    const { entryId } = await submittedWithRun('Rerun beside a run');
    const db = logServer().dataSource;
    // The researcher's run of the cell, waiting for a worker (its job is not in the queue, so it stays there).
    const [own] = (await db.query(
      `INSERT INTO analysis_run (notebook_id, entry_id, cell_id, input_hash, request, started_by_id, status, budget_ms, job_id)
       SELECT e.notebook_id, e.id, $2, 'waiting', '{}', u.id, 'queued', 1000, gen_random_uuid()
       FROM entry e, app_user u WHERE e.id = $1 AND u.email = $3 RETURNING id`,
      [entryId, BRANCH_CELL, DEMO_PEOPLE.researcher.email],
    )) as { id: string }[];
    try {
      const report = reproducibilityReportSchema.parse((await ines.get(`${entryUrl(entryId)}/review/reproducibility`)).body);
      expect(report.status).toBe('reproduced');
      const [{ status }] = (await db.query(`SELECT status FROM analysis_run WHERE id = $1`, [own.id])) as { status: string }[];
      expect(status).toBe('queued');
      // The cell's progress shows the researcher's run, not the rerun.
      expect((await kofi.get(`${entryUrl(entryId)}/cells/${BRANCH_CELL}/run`)).body).toMatchObject({ state: 'waiting', startedBy: { name: DEMO_PEOPLE.researcher.name } });
    } finally {
      await db.query(`DELETE FROM analysis_run WHERE id = $1`, [own.id]);
    }
  });

  it('says exactly what differs when the stored result is not what the engine computes, and signs only when told to', async () => {
    // The stored run is altered in the database, so the revision records a fold at μ = −0.2487 that the engine puts at −0.25.
    const db = logServer().dataSource;
    const { entryId, rev, run } = await submittedWithRun('Altered branch', async (hash) => {
      await db.query(`UPDATE analysis_result SET result = jsonb_set(result, '{branch,events,0,parameter}', to_jsonb((result #>> '{branch,events,0,parameter}')::float8 + 0.0013)) WHERE input_hash = $1`, [hash]);
    });
    const storedFold = (run.result as { branch: { events: { parameter: number }[] } }).branch.events[0].parameter;
    expect(storedFold).toBeCloseTo(-0.2487, 6);

    const refused = await ines.post(`${entryUrl(entryId)}/review/approve`, { revisionId: rev.id, password: DEMO_PEOPLE.pi.password });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('not_reproduced');
    const report = reproducibilityReportSchema.parse(refused.body.error.reproducibility);
    expect(report.status).toBe('differs');
    expect(report.cells[0].status).toBe('differs');
    expect(report.cells[0].differences).toEqual([`fold near mu = -0.2487: stored -0.248700, rerun -0.250000`]);
    expect(report.differences).toEqual([`cell ${BRANCH_CELL} (branch): fold near mu = -0.2487: stored -0.248700, rerun -0.250000`]);
    expect(revisionSchema.parse((await kofi.get(`${entryUrl(entryId)}/revisions/${rev.id}`)).body).signatures).toEqual([]);

    const signed = await ines.post(`${entryUrl(entryId)}/review/approve`, { revisionId: rev.id, password: DEMO_PEOPLE.pi.password, acceptDifferences: true });
    expect(signed.status).toBe(200);
    const [sig] = reviewDetailSchema.parse(signed.body).signatures;
    expect(sig.reproducibility.status).toBe('differs');
    expect(sig.reproducibility.differences).toEqual(report.differences);
    const [event] = (await db.query(`SELECT summary FROM audit_event WHERE action = 'review.approved' AND summary->>'entryId' = $1`, [entryId])) as { summary: Record<string, unknown> }[];
    expect(event.summary).toMatchObject({ reproducibility: 'differs', printedName: 'Dr. Ines Halvorsen', meaning: 'approved', contentHash: rev.contentHash });
  });
  // Last in the file: afterwards this PI may not sign for a while.
  it('stops accepting signing passwords after repeated wrong ones (429), each wrong one audited', async () => {
    const { entryId, rev } = await submittedWithRun('Guessing');
    for (let i = 0; i < SIGNATURE_FAILURES_PER_WINDOW; i += 1) {
      expect((await ines.post(`${entryUrl(entryId)}/review/approve`, { revisionId: rev.id, password: `guess-${i}` })).status).toBe(401);
    }
    const limited = await ines.post(`${entryUrl(entryId)}/review/approve`, { revisionId: rev.id, password: DEMO_PEOPLE.pi.password });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    const [{ n }] = (await logServer().dataSource.query(
      `SELECT count(*)::int AS n FROM audit_event WHERE action = 'review.signature_failed' AND summary->>'entryId' = $1`, [entryId],
    )) as { n: number }[];
    expect(n).toBe(SIGNATURE_FAILURES_PER_WINDOW);
  });
});
