import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCellResponseSchema, type EntryDetail, type Revision } from '@shared/api/entries.ts';
import { exportSourceSchema } from '@shared/api/exports.ts';
import type { FoldCurveResult, SimulateResult } from '@shared/engine/contract.ts';
import { csvField, resultCsv } from '@server/services/exports/result-csv.ts';
import { expectClose } from '../support/tolerances.ts';
import {
  SADDLE_BRANCH_CELL_ID,
  auditActionsFor,
  closeLogServer,
  demoNotebookId,
  saddleBranchTask,
  saddleDoc,
  saddleModel,
  signIn,
  startLogServer,
  type Client,
} from './entries-support.ts';

const sha = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
describe('result CSV', () => {
  const engine = { version: 'test', elapsedMs: 1 };

  it('quotes fields the way RFC 4180 §2 says (separators, quotes, line breaks, edge spaces)', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "fold"')).toBe('"say ""fold"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField(' padded')).toBe('" padded"');
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(csvField(Number.NaN)).toBe('');
  });

  it('writes trajectory samples as t and one column per variable', () => {
    // x(t) = e^(−t), the solution of x′ = −x from x(0) = 1 (closed form).
    const t = [0, 0.5, 1];
    const result: SimulateResult = { trajectory: { t, state: { x: t.map((s) => Math.exp(-s)), y: [1, 2, 3] } }, stopReason: 'end', steps: { accepted: 3, rejected: 0 }, engine };
    const [header, ...rows] = resultCsv(result, {}).trim().split('\r\n');
    expect(header).toBe('t,x,y');
    expect(rows.map((r) => Number(r.split(',')[1]))).toEqual(t.map((s) => Math.exp(-s)));
  });

  it('writes fold-curve points with both parameters and marks the cusp', () => {
    // On the fold curve of x′ = h + r x − x³: r = 3x², h = −2x³ (Strogatz, Nonlinear Dynamics and Chaos, §3.6).
    const xs = [-0.5, 0, 0.5];
    const result: FoldCurveResult = {
      curve: {
        points: xs.map((x) => ({ parameters: { h: -2 * x ** 3, r: 3 * x * x }, state: { x }, normalForm: { a: 1, b: -6 * x }, residual: 0 })),
        events: [{ kind: 'cusp', parameters: { h: 0, r: 0 }, state: { x: 0 }, after: 1 }],
        stopReason: 'bounds',
      },
      engine,
    };
    const lines = resultCsv(result, { parameters: ['h', 'r'] }).trim().split('\r\n');
    expect(lines[0]).toBe('index,h,r,x,event_after_point');
    expect(lines[1]).toBe('0,0.25,0.75,-0.5,');
    expect(lines[2]).toBe('1,0,0,0,cusp');
  });
});

describe('exports API', () => {
  let kofi: Client;
  let jun: Client;
  let mira: Client;
  let notebook: string;
  let entryId: string;
  let revision: Revision;
  let base: string;
  const csvBytes = Buffer.from('mu,x\n0.5,0.70\n');

  beforeAll(async () => {
    await startLogServer();
    [kofi, jun, mira] = await Promise.all([signIn('researcher'), signIn('reader'), signIn('researcher2')]);
    notebook = await demoNotebookId('stirredTank');
    const created = (await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Saddle-node export', entryDate: '2026-11-24', tags: ['fold'] })).body as EntryDetail;
    entryId = created.entry.id;
    const run = runCellResponseSchema.parse(
      (await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/cells/${SADDLE_BRANCH_CELL_ID}/run`, { model: saddleModel, task: saddleBranchTask })).body,
    );
    const { cached: _cached, ...output } = run;
    revision = (
      await kofi.post(`/api/notebooks/${notebook}/entries/${entryId}/revisions`, {
        baseRevisionId: created.head.id, title: 'Saddle-node export', entryDate: '2026-11-24', tags: ['fold'], document: saddleDoc('Where <the> fold sits.'), outputs: { [SADDLE_BRANCH_CELL_ID]: output },
      })
    ).body as Revision;
    base = `/api/notebooks/${notebook}/entries/${entryId}`;
    expect((await kofi.post(`${base}/figures`, { revisionId: revision.id, cellId: SADDLE_BRANCH_CELL_ID, caption: 'The fold' })).status).toBe(201);
    const { csrfToken } = (await kofi.agent.get('/api/auth/csrf')).body as { csrfToken: string };
    const up = await kofi.agent.post(`${base}/attachments`).set('x-csrf-token', csrfToken).attach('file', csvBytes, { filename: 'bench run.csv', contentType: 'text/csv' });
    expect(up.status).toBe(201);
  });
  afterAll(closeLogServer);

  it('exports branch points as CSV that agree with the closed form x² = μ (stable where x > 0)', async () => {
    const res = await jun.get(`${base}/export/cells/${SADDLE_BRANCH_CELL_ID}?format=csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    expect(res.headers['content-disposition']).toContain('saddle-node-export-r2-branch.csv');
    const [header, ...rows] = (res.text as string).trim().split('\r\n').map((l) => l.split(','));
    expect(header.slice(0, 6)).toEqual(['index', 'mu', 'x', 'stability', 'unstable_dimension', 'event_after_point']);
    expect(rows.length).toBe(revision.outputs[SADDLE_BRANCH_CELL_ID].result && 'branch' in revision.outputs[SADDLE_BRANCH_CELL_ID].result! ? revision.outputs[SADDLE_BRANCH_CELL_ID].result!.branch.points.length : -1);
    for (const [, mu, x, stability] of rows) {
      // Equilibria of x' = μ − x² are x = ±√μ; f'(x) = −2x, so x > 0 is stable (closed form).
      expectClose(Number(x) ** 2, Number(mu), 1e-6, 1e-8);
      if (Number(x) > 1e-3) expect(stability).toBe('stable');
      if (Number(x) < -1e-3) expect(stability).toBe('unstable');
    }
    expect(rows.filter((r) => r[5] === 'fold')).toHaveLength(1);
  });

  it('exports the whole result as JSON with where it came from', async () => {
    const res = await jun.get(`${base}/export/cells/${SADDLE_BRANCH_CELL_ID}?format=json`);
    expect(res.status).toBe(200);
    const source = exportSourceSchema.parse(res.body.source);
    expect(source).toMatchObject({ revisionId: revision.id, contentHash: revision.contentHash, inputHash: revision.outputs[SADDLE_BRANCH_CELL_ID].inputHash, cellKind: 'branch' });
    expect(res.body.result.branch.events[0].kind).toBe('fold');
  });

  it.each([
    ['a bad format', `export/cells/${SADDLE_BRANCH_CELL_ID}?format=xlsx`, 400, 'format is "csv" or "json"'],
    ['an unknown cell', 'export/cells/11111111-2222-4333-8444-555555555555', 404, 'No such cell'],
    ['an unknown revision', `export/record?revisionId=11111111-2222-4333-8444-555555555555`, 404, 'No such revision'],
  ])('answers %s clearly', async (_label, url, status, message) => {
    const res = await jun.get(`${base}/${url}`);
    expect(res.status).toBe(status);
    const error = res.body.error as { message: string; fields?: { message: string }[] };
    expect([error.message, ...(error.fields ?? []).map((f) => f.message)].join(' | ')).toContain(message);
  });

  it('prints a record with the document (escaped), results, figures, attachments, signatures and audit trail', async () => {
    const res = await jun.get(`${base}/export/record`);
    expect(res.status).toBe(200);
    const html = res.text as string;
    expect(html).toContain('<h1>Saddle-node export</h1>');
    expect(html).toContain('Where &lt;the&gt; fold sits.');
    expect(html).toContain('@media print');
    expect(html).toContain(`Content hash <code>${revision.contentHash}</code>`);
    expect(html).toMatch(/<td>fold<\/td><td>0<\/td>|<td>fold<\/td><td>-?\d(\.\d+)?e-\d+<\/td>/);
    expect(html).toContain('bench run.csv');
    expect(html).toContain('/figures/');
    expect(html).toContain('This revision has not been signed.');
    for (const action of ['entry.created', 'revision.recorded', 'figure.attached', 'attachment.added']) expect(html).toContain(`<td>${action}</td>`);
    expect(await auditActionsFor(entryId)).toContain('export.created');
  });

  it('packs the whole entry into one ZIP whose files match their recorded hashes', async () => {
    const res = await jun.agent.get(`${base}/export/archive`).responseType('blob');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const dir = mkdtempSync(path.join(os.tmpdir(), 'bifolio-zip-'));
    try {
      const zipPath = path.join(dir, 'entry.zip');
      writeFileSync(zipPath, res.body as Buffer);
      execFileSync('unzip', ['-tq', zipPath]);
      const names = execFileSync('unzip', ['-Z1', zipPath], { encoding: 'utf8' }).trim().split('\n');
      expect(names).toEqual(expect.arrayContaining(['entry.json', 'document.txt', 'record.html', 'audit.json', 'manifest.json', `results/${SADDLE_BRANCH_CELL_ID}.json`, `results/${SADDLE_BRANCH_CELL_ID}.csv`]));
      expect(names.some((n) => /^figures\/.+\.svg$/.test(n))).toBe(true);
      expect(names.some((n) => /^figures\/.+\.png$/.test(n))).toBe(true);
      const attachment = names.find((n) => n.endsWith('-bench run.csv'));
      expect(attachment).toBeDefined();
      const read = (n: string) => execFileSync('unzip', ['-p', zipPath, n]);
      expect(read(attachment!)).toEqual(csvBytes);
      const manifest = JSON.parse(read('manifest.json').toString()) as { contentHash: string; files: { path: string; sha256?: string }[] };
      expect(manifest.contentHash).toBe(revision.contentHash);
      for (const f of manifest.files.filter((x) => x.sha256)) expect(sha(read(f.path))).toBe(f.sha256);
      const entryJson = JSON.parse(read('entry.json').toString()) as { revision: Revision };
      expect(entryJson.revision.outputs[SADDLE_BRANCH_CELL_ID].inputHash).toBe(revision.outputs[SADDLE_BRANCH_CELL_ID].inputHash);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('shows nothing to people outside the notebook', async () => {
    expect((await mira.get(`${base}/export/archive`)).status).toBe(404);
    expect((await mira.get(`${base}/export/cells/${SADDLE_BRANCH_CELL_ID}`)).status).toBe(404);
  });
});
