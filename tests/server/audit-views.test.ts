import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { auditPageSchema, auditVerifyReportSchema, AUDIT_CSV_COLUMNS } from '@shared/api/audit.ts';
import type { EntryDetail } from '@shared/api/entries.ts';
import { csvField } from '@server/services/audit/export-audit-csv.ts';
import { closeLogServer, demoNotebookId, logServer, paragraphDoc, signIn, startLogServer, type Client } from './entries-support.ts';

const run = promisify(execFile);

/** Parses RFC 4180 CSV (quoted fields, doubled quotes, CRLF rows). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i += 1) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i += 1;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(field);
      field = '';
    }
    else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i += 1;
    } else field += c;
  }
  return rows;
}

describe('audit views API', () => {
  let sam: Client;
  let ines: Client;
  let kofi: Client;
  let jun: Client;
  let mira: Client;
  let tank: string;
  let lake: string;
  let entryId: string;

  beforeAll(async () => {
    await startLogServer();
    [sam, ines, kofi, jun, mira] = await Promise.all([signIn('admin'), signIn('pi'), signIn('researcher'), signIn('reader'), signIn('researcher2')]);
    [tank, lake] = await Promise.all([demoNotebookId('stirredTank'), demoNotebookId('shallowLake')]);
    const entry = (await kofi.post(`/api/notebooks/${tank}/entries`, { title: 'Audit views, "quoted", comma', entryDate: '2026-11-28' })).body as EntryDetail;
    entryId = entry.entry.id;
    for (const text of ['one', 'two']) {
      const head = ((await kofi.get(`/api/notebooks/${tank}/entries/${entryId}`)).body as EntryDetail).head.id;
      await kofi.post(`/api/notebooks/${tank}/entries/${entryId}/revisions`, { baseRevisionId: head, title: 'Audit views, "quoted", comma', entryDate: '2026-11-28', tags: [], document: paragraphDoc(text), outputs: {} });
    }
  });
  afterAll(closeLogServer);

  it('shows an entry’s trail to the notebook’s PI and administrators, newest first, with actor names', async () => {
    for (const who of [ines, sam]) {
      const res = await who.get(`/api/audit?entryId=${entryId}`);
      expect(res.status).toBe(200);
      const page = auditPageSchema.parse(res.body);
      expect(page.events.map((e) => e.action)).toEqual(['revision.recorded', 'revision.recorded', 'revision.recorded', 'entry.created']);
      expect(page.total).toBe(4);
      expect(page.events[0]).toMatchObject({ actor: { name: 'Kofi Mensah' }, notebookId: tank, entityType: 'revision' });
      expect(BigInt(page.events[0].sequence)).toBeGreaterThan(BigInt(page.events[1].sequence));
    }
  });

  it('gives each event’s ids in words: entry title, notebook name, revision number, people and cells', async () => {
    const page = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}`)).body);
    const [newest] = page.events;
    expect(newest.references[newest.entityId!]).toEqual({ kind: 'revision', label: 'revision 3', notebookId: tank, entryId });
    expect(newest.references[entryId]).toEqual({ kind: 'entry', label: 'Audit views, "quoted", comma', notebookId: tank, entryId });
    expect(newest.references[tank]).toMatchObject({ kind: 'notebook', label: 'Stirred-tank ignition and extinction' });

    const members = auditPageSchema.parse((await ines.get(`/api/audit?notebookId=${tank}&action=membership`)).body);
    const added = members.events.find((e) => typeof e.summary.userId === 'string');
    expect(added, 'the demo notebook’s trail has membership events').toBeDefined();
    expect(added!.references[added!.summary.userId as string]).toMatchObject({ kind: 'person', label: expect.stringMatching(/\w+ \w+/) });

    const runs = auditPageSchema.parse((await ines.get(`/api/audit?notebookId=${tank}&action=cell.run&pageSize=5`)).body);
    for (const run of runs.events) expect(run.references[run.entityId!]).toMatchObject({ kind: 'cell', label: expect.stringMatching(/ cell/) });
  });

  it('refuses the notebook’s researcher and reader (403) and a non-member (404)', async () => {
    expect((await kofi.get(`/api/audit?notebookId=${tank}`)).status).toBe(403);
    expect((await jun.get(`/api/audit?entryId=${entryId}`)).status).toBe(403);
    expect((await mira.get(`/api/audit?entryId=${entryId}`)).status).toBe(404);
    expect((await mira.get(`/api/audit?notebookId=${tank}`)).status).toBe(404);
    // An entry does not belong to another notebook.
    expect((await ines.get(`/api/audit?notebookId=${lake}&entryId=${entryId}`)).status).toBe(404);
    expect((await kofi.get('/api/audit')).status).toBe(403);
  });

  it('shows a person their own trail, and anyone’s to administrators only', async () => {
    const kofiId = (await kofi.user()).id;
    const own = auditPageSchema.parse((await kofi.get(`/api/audit?actorId=${kofiId}&action=auth`)).body);
    expect(own.events.length).toBeGreaterThan(0);
    expect(own.events.every((e) => e.actor?.id === kofiId && e.action.startsWith('auth.'))).toBe(true);
    expect((await jun.get(`/api/audit?actorId=${kofiId}`)).status).toBe(403);
    expect((await sam.get(`/api/audit?actorId=${kofiId}`)).status).toBe(200);
    expect((await sam.get('/api/audit')).status).toBe(200);
  });

  it('filters by action, actor and date range, and pages', async () => {
    const byAction = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}&action=entry.created`)).body);
    expect(byAction.events.map((e) => e.action)).toEqual(['entry.created']);
    const today = new Date().toISOString().slice(0, 10);
    const inRange = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}&from=${today}&to=${today}`)).body);
    expect(inRange.total).toBe(4);
    const before = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}&to=2020-01-01`)).body);
    expect(before.total).toBe(0);
    const page2 = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}&page=2&pageSize=3`)).body);
    expect(page2).toMatchObject({ page: 2, pageSize: 3, total: 4 });
    expect(page2.events.map((e) => e.action)).toEqual(['entry.created']);
    const byOther = auditPageSchema.parse((await ines.get(`/api/audit?entryId=${entryId}&actorId=${(await ines.user()).id}`)).body);
    expect(byOther.total).toBe(0);
  });

  it.each([
    ['pageSize=500', 'pageSize'],
    ['page=0', 'page'],
    ['from=yesterday', 'from'],
    ['action=DROP%20TABLE', 'action'],
    ['entryId=42', 'entryId'],
    ['format=xml', 'format'],
    ['from=2026-11-30&to=2026-11-01', 'to'],
  ])('refuses %s naming the field', async (query, field) => {
    const res = await sam.get(`/api/audit?${query}`);
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
  });

  it('exports the filtered trail as CSV, oldest first, and audits the export', async () => {
    const res = await ines.get(`/api/audit?entryId=${entryId}&format=csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="audit-\d{4}-\d{2}-\d{2}\.csv"$/);
    const rows = parseCsv(res.text);
    expect(rows[0]).toEqual([...AUDIT_CSV_COLUMNS]);
    expect(rows.slice(1).map((r) => r[4])).toEqual(['entry.created', 'revision.recorded', 'revision.recorded', 'revision.recorded']);
    const created = rows[1];
    expect(created[3]).toBe('Kofi Mensah');
    expect(JSON.parse(created[8])).toMatchObject({ title: 'Audit views, "quoted", comma' });
    const [exported] = (await logServer().dataSource.query(
      `SELECT actor_id, notebook_id, summary FROM audit_event WHERE action = 'audit.exported' ORDER BY seq DESC LIMIT 1`,
    )) as { actor_id: string; notebook_id: string; summary: { filter: Record<string, unknown> } }[];
    expect(exported).toMatchObject({ actor_id: (await ines.user()).id, notebook_id: tank, summary: { filter: { entryId } } });
    expect((await jun.get(`/api/audit?entryId=${entryId}&format=csv`)).status).toBe(403);
  });

  it('quotes CSV fields and defuses spreadsheet formulas', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('=SUM(A1)')).toBe("'=SUM(A1)");
    expect(csvField(null)).toBe('');
  });

  it('verifies the chain for administrators only, through the endpoint and the command; a tampered row is found', async () => {
    expect((await ines.get('/api/audit/verify')).status).toBe(403);
    const ok = auditVerifyReportSchema.parse((await sam.get('/api/audit/verify')).body);
    expect(ok.ok).toBe(true);
    expect(ok.checked).toBeGreaterThan(4);
    const env = { ...process.env, DATABASE_URL: inject('databaseUrl') };
    const cmd = await run('node_modules/.bin/tsx', ['scripts/verify-audit.ts'], { env });
    expect(JSON.parse(cmd.stdout.split('\n')[0])).toMatchObject({ ok: true });

    // Tamper with one row directly (the append-only trigger is lifted for this test only).
    const db = logServer().dataSource;
    const [target] = (await db.query(`SELECT seq::text AS seq, summary FROM audit_event WHERE action = 'entry.created' AND entity_id = $1`, [entryId])) as { seq: string; summary: object }[];
    const overwrite = async (summary: object) => {
      await db.query(`ALTER TABLE audit_event DISABLE TRIGGER audit_event_append_only`);
      try {
        await db.query(`UPDATE audit_event SET summary = $1::jsonb WHERE seq = $2`, [JSON.stringify(summary), target.seq]);
      } finally {
        await db.query(`ALTER TABLE audit_event ENABLE TRIGGER audit_event_append_only`);
      }
    };
    await overwrite({ ...target.summary, title: 'Rewritten' });
    try {
    const broken = auditVerifyReportSchema.parse((await sam.get('/api/audit/verify')).body);
    expect(broken).toMatchObject({ ok: false, firstBrokenSequence: target.seq, reason: 'content_changed' });
    const failed = await run('node_modules/.bin/tsx', ['scripts/verify-audit.ts'], { env }).then(
      () => null,
      (error: { code: number; stdout: string }) => error,
    );
    expect(failed?.code).toBe(1);
    expect(JSON.parse(failed?.stdout.split('\n')[0] ?? '{}')).toMatchObject({ ok: false, firstBrokenSequence: target.seq });
    expect(failed?.stdout).toContain(`The audit chain is broken at sequence ${target.seq}`);
    } finally {
      await overwrite(target.summary); // put it back so later test files see a whole chain
    }
    expect(auditVerifyReportSchema.parse((await sam.get('/api/audit/verify')).body).ok).toBe(true);
  });
});
