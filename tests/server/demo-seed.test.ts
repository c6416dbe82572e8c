import 'reflect-metadata';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { canonicalJson } from '@shared/cells/hash.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import { resultFor, type CellOutputs } from '@shared/cells/output.ts';
import { resolveFromCells } from '@shared/cells/resolve.ts';
import { documentToPlainText, extractCells, type DocumentJson } from '@shared/editor/document.ts';
import type { AnalyzeResult } from '@shared/engine/contract.ts';
import { createDataSource } from '@server/data-source.ts';
import { analyze, ENGINE_VERSION } from '@server/engine/index.ts';
import { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import { AttachmentEntity } from '@server/entities/attachment.entity.ts';
import { FigureEntity } from '@server/entities/figure.entity.ts';
import { MeasurementSetEntity } from '@server/entities/measurement-set.entity.ts';
import { CommentEntity } from '@server/entities/comment.entity.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { ReviewEntity } from '@server/entities/review.entity.ts';
import { RevisionEntity } from '@server/entities/revision.entity.ts';
import { SignatureEntity } from '@server/entities/signature.entity.ts';
import { requestInputHash } from '@server/services/analysis/request-hash.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { parseEnv } from '@server/env.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { startFakeS3 } from '../../fake-s3/start-fake-s3.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { freePort } from '../support/free-port.ts';
import { runSeed } from '../../seeds/seed.ts';
import { DEMO_SCENARIOS } from '../../seeds/scenario/index.ts';

/**
 * The demo seed as the server tests' global setup ran it (tests/support/server-global-setup.ts):
 * the research record a newcomer clicks through, with every result computed by the engine.
 */

let dataSource: DataSource;
let revisions: (RevisionEntity & { entry: EntryEntity })[];

/** Same significant digits as the cited text ("0.0709" has three). */
const significantDigits = (text: string) => text.replace(/^-?0*\.?0*/, '').replace('.', '').length;
const sameAsPrinted = (value: number, printed: string) =>
  Number(value.toPrecision(significantDigits(printed))) === Number(printed);
/** A result with the run's timing taken out (it differs from run to run). */
const withoutTiming = (result: AnalyzeResult) =>
  canonicalJson({ ...result, engine: { version: result.engine.version } });

beforeAll(async () => {
  dataSource = await createDataSource(inject('databaseUrl'), { poolSize: 2 }).initialize();
  revisions = (
    await dataSource.manager.find(RevisionEntity, { relations: { entry: true }, order: { number: 'ASC' } })
  ).filter((r) =>
    DEMO_SCENARIOS().some((s) => s.entries.some((e) => e.title === r.entry.title)),
  ) as (RevisionEntity & { entry: EntryEntity })[];
});
afterAll(async () => {
  await dataSource.destroy();
});

describe('demo seed', () => {
  it('creates every scenario entry in its notebook, dated in the days before the seed, with all its revisions', async () => {
    const today = new Date().toISOString().slice(0, 10);
    const weekAgo = new Date(Date.now() - 7 * 86_400_000).toISOString().slice(0, 10);
    for (const scenario of DEMO_SCENARIOS()) {
      const notebook = await dataSource.manager.findOneByOrFail(NotebookEntity, {
        title: DEMO_NOTEBOOKS[scenario.notebook].title,
      });
      for (const planned of scenario.entries) {
        const entry = await dataSource.manager.findOneOrFail(EntryEntity, {
          where: { notebookId: notebook.id, title: planned.title },
          relations: { author: true },
        });
        expect(entry.author.email).toBe(DEMO_PEOPLE[planned.author].email);
        expect(
          entry.entryDate >= weekAgo && entry.entryDate <= today,
          `${entry.title} dated ${entry.entryDate}`,
        ).toBe(true);
        // The empty first revision, then the scenario's saves.
        expect(entry.revisionCount).toBe(planned.revisions.length + 1);
        const saved = revisions.filter((r) => r.entryId === entry.id);
        expect(saved.map((r) => r.number)).toEqual(
          Array.from({ length: entry.revisionCount }, (_, i) => i + 1),
        );
        const authors = await dataSource.manager.find(RevisionEntity, {
          where: { entryId: entry.id },
          relations: { author: true },
          order: { number: 'ASC' },
        });
        expect(authors.slice(1).map((r) => r.author.email)).toEqual(
          planned.revisions.map((r) => DEMO_PEOPLE[r.author].email),
        );
      }
    }
    expect(revisions.length).toBeGreaterThanOrEqual(20);
  });

  it('stores an ok output for every analysis cell, verified against the stored run and a fresh engine run', async () => {
    const fresh = new Map<string, string>();
    let checked = 0;
    for (const revision of revisions) {
      const cells = extractCells(revision.document);
      const outputs = revision.outputs as CellOutputs;
      for (const cell of cells.filter((c) => isAnalysisKind(c.kind))) {
        const output = outputs[cell.id];
        expect(output, `${revision.entry.title} r${revision.number} ${cell.kind}`).toBeDefined();
        expect(output.status).toBe('ok');
        const resolution = resolveFromCells(cells, cell);
        if (!resolution.ok)
          throw new Error(`${cell.kind} does not resolve: ${JSON.stringify(resolution.problems)}`);
        expect(output.inputHash).toBe(requestInputHash(ENGINE_VERSION, resolution.request));
        const stored = await dataSource.manager.findOneByOrFail(AnalysisResultEntity, {
          inputHash: output.inputHash,
        });
        expect(canonicalJson(stored.result)).toBe(canonicalJson(output.result));
        if (!fresh.has(output.inputHash))
          fresh.set(output.inputHash, withoutTiming(analyze(resolution.request)));
        expect(withoutTiming(output.result as AnalyzeResult)).toBe(fresh.get(output.inputHash));
        expect(JSON.stringify(output.result)).not.toContain('time-limit');
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThanOrEqual(25);
  });

  it('cites folds and cusps in the prose exactly as the cells computed them', () => {
    let folds = 0;
    let cusps = 0;
    for (const revision of revisions) {
      const text = documentToPlainText(revision.document as DocumentJson);
      const cells = extractCells(revision.document);
      const outputs = revision.outputs as CellOutputs;
      const branchFolds = cells.flatMap((c) => {
        const result = c.kind === 'branch' ? resultFor('branch', outputs[c.id]) : null;
        const parameter = (c.input.task as { parameter?: string } | undefined)?.parameter;
        return (result?.branch.events ?? [])
          .filter((e) => e.kind === 'fold')
          .map((e) => ({ parameter, value: e.parameter }));
      });
      for (const [, name, value] of text.matchAll(/fold at ([A-Za-z]\w*) = (-?\d+(?:\.\d+)?)/g)) {
        expect(
          branchFolds.some((f) => f.parameter === name && sameAsPrinted(f.value, value)),
          `"${revision.entry.title}" r${revision.number} cites a fold at ${name} = ${value}; the branch cells have ${JSON.stringify(branchFolds)}`,
        ).toBe(true);
        folds += 1;
      }
      const mapCusps = cells.flatMap((c) =>
        c.kind === 'fold-map' ? (resultFor('fold-map', outputs[c.id])?.curve.events ?? []) : [],
      );
      for (const [, p1, p2, v1, v2] of text.matchAll(
        /cusp at \((\w+), (\w+)\) = \((-?[\d.]+), (-?[\d.]+)\)/g,
      )) {
        expect(
          mapCusps.some((c) => sameAsPrinted(c.parameters[p1], v1) && sameAsPrinted(c.parameters[p2], v2)),
          `"${revision.entry.title}" r${revision.number} cites a cusp at (${p1}, ${p2}) = (${v1}, ${v2})`,
        ).toBe(true);
        cusps += 1;
      }
    }
    expect(folds).toBeGreaterThanOrEqual(10);
    expect(cusps).toBeGreaterThanOrEqual(3);
  });

  it('shows the folds where the prose says: the tank ignites at a larger residence time than it goes out', () => {
    const head = revisions
      .filter((r) => r.entry.title === 'Ignition and extinction along the residence time')
      .at(-1);
    if (!head) throw new Error('The branch entry is missing');
    const branchCell = extractCells(head.document).find((c) => c.kind === 'branch');
    const result = resultFor('branch', (head.outputs as CellOutputs)[branchCell?.id ?? '']);
    const folds = (result?.branch.events ?? []).filter((e) => e.kind === 'fold');
    expect(folds).toHaveLength(2);
    const [ignition, extinction] = [...folds].sort((a, b) => a.state.x2 - b.state.x2);
    // Ignition ends the cold (lower-temperature) branch, at the larger Da: hysteresis.
    expect(ignition.parameter).toBeGreaterThan(extinction.parameter);
    expect(documentToPlainText(head.document)).toContain(
      `Ignition: the cold branch ends at the fold at Da = ${Number(ignition.parameter.toPrecision(3))}`,
    );
  });

  it('leaves a signed approval, a request for changes, a pending review and comment threads (one resolved)', async () => {
    const byTitle = async (title: string) => dataSource.manager.findOneByOrFail(EntryEntity, { title });
    const approved = await byTitle('Steady states of the cooled tank');
    expect(approved.status).toBe('approved');
    const signature = await dataSource.manager.findOneOrFail(SignatureEntity, {
      where: { revisionId: approved.headRevisionId ?? '' },
      relations: { signer: true },
    });
    expect(signature).toMatchObject({ meaning: 'approved', printedName: DEMO_PEOPLE.pi.name });
    expect(signature.signer.email).toBe(DEMO_PEOPLE.pi.email);
    const head = await dataSource.manager.findOneByOrFail(RevisionEntity, {
      id: approved.headRevisionId ?? '',
    });
    expect(signature.contentHash).toBe(head.contentHash);

    expect((await byTitle('Ignition and extinction along the residence time')).status).toBe(
      'changes-requested',
    );
    const pending = await byTitle('Fold map in residence time and heat of reaction');
    expect(pending.status).toBe('in-review');
    const open = await dataSource.manager.findOneOrFail(ReviewEntity, {
      where: { entryId: pending.id, status: 'open' },
      relations: { requestedBy: true },
    });
    expect(open.requestedBy.email).toBe(DEMO_PEOPLE.researcher.email);

    const comments = await dataSource.manager.find(CommentEntity, {
      where: { entryId: (await byTitle('Clear and turbid states under the present loading')).id },
    });
    const thread = comments.find((c) => c.parentId === null);
    expect(thread?.resolvedAt).not.toBeNull();
    expect(comments.some((c) => c.parentId === thread?.id)).toBe(true);
    const all = await dataSource.manager.count(CommentEntity);
    expect(all).toBeGreaterThanOrEqual(5);
  });

  it('writes the whole story to an intact audit trail', async () => {
    const rows = (await dataSource.query(
      `SELECT action, count(*)::int AS n FROM audit_event GROUP BY action`,
    )) as { action: string; n: number }[];
    const counts = Object.fromEntries(rows.map((r) => [r.action, r.n]));
    for (const action of [
      'entry.created',
      'revision.recorded',
      'cell.run',
      'review.submitted',
      'review.approved',
      'review.changes_requested',
      'comment.created',
      'comment.resolved',
    ]) {
      expect(counts[action], action).toBeGreaterThan(0);
    }
    expect(counts['revision.recorded']).toBeGreaterThanOrEqual(revisions.length);
    expect((await verifyAuditChain(dataSource.manager)).ok).toBe(true);
  });

  it('does nothing when run again', async () => {
    const count = async () =>
      (await dataSource.query(
        `SELECT (SELECT count(*) FROM entry) AS e, (SELECT count(*) FROM revision) AS r, (SELECT count(*) FROM audit_event) AS a`,
      )) as unknown[];
    const before = await count();
    const lines: string[] = [];
    expect(await runSeed(dataSource, (line) => lines.push(line))).toBe(false);
    expect(lines).toEqual(['Demo data already present: not seeding again.']);
    expect(await count()).toEqual(before);
  });

  it('imports the invented pilot-tank readings, labelled as demo data, close to the computed branch', async () => {
    const set = await dataSource.manager.findOneByOrFail(MeasurementSetEntity, {
      name: 'Pilot tank readings (demo data, invented)',
    });
    expect(set).toMatchObject({ parameterName: 'Da', stateName: 'x2' });
    expect(set.rows).toHaveLength(10);
    for (const row of set.rows) expect(row.value).toBeGreaterThan(0);
  });
});

describe('demo seed with file storage', () => {
  it('attaches the readings CSV and renders figures of two branch cells into a fresh database', async () => {
    const database = `demo_seed_files_${process.pid}`;
    await dataSource.query(`CREATE DATABASE ${database}`);
    const url = new URL(inject('databaseUrl'));
    url.pathname = `/${database}`;
    const tmp = mkdtempSync(path.join(os.tmpdir(), 'bifolio-demo-seed-'));
    const s3Port = await freePort();
    const env = parseEnv({
      NODE_ENV: 'test',
      DATABASE_URL: url.toString(),
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      BIFOLIO_DATA_DIR: tmp,
    });
    const s3 = await startFakeS3({ port: s3Port, directory: path.join(tmp, 's3'), bucket: env.S3_BUCKET });
    const storage = createS3Storage(env);
    const fresh = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
    try {
      await fresh.runMigrations({ transaction: 'each' });
      expect(await runSeed(fresh, () => undefined, { storage, publicUrl: 'http://127.0.0.1:4800' })).toBe(
        true,
      );
      const [attachment] = await fresh.manager.find(AttachmentEntity);
      expect(attachment).toMatchObject({
        originalName: 'pilot-tank-readings-demo-invented.csv',
        contentType: 'text/csv',
      });
      const bytes = await storage.get(attachment.storageKey);
      expect(bytes?.toString()).toMatch(/^# DEMO DATA, INVENTED: not measured\./);
      const figures = await fresh.manager.find(FigureEntity);
      expect(figures.map((f) => f.cellKind).sort()).toEqual(['branch', 'branch']);
      for (const figure of figures) {
        const png = await storage.get(figure.pngKey);
        expect(png?.subarray(1, 4).toString()).toBe('PNG');
      }
    } finally {
      await fresh.destroy();
      storage.client.destroy();
      await s3.close();
      rmSync(tmp, { recursive: true, force: true });
      await dataSource.query(`DROP DATABASE IF EXISTS ${database}`);
    }
  }, 120_000);
});
