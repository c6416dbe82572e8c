import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { draftSchema, entryDetailSchema, entryListSchema, type EntryDetail, type EntryList } from '@shared/api/entries.ts';
import { auditActionsFor, closeLogServer, demoNotebookId, paragraphDoc, signIn, startLogServer, type Client } from './entries-support.ts';

describe('entries API', () => {
  let kofi: Client;
  let mira: Client;
  let jun: Client;
  let ines: Client;
  let stirredTank: string;
  let shallowLake: string;

  beforeAll(async () => {
    await startLogServer();
    [kofi, mira, jun, ines] = await Promise.all([signIn('researcher'), signIn('researcher2'), signIn('reader'), signIn('pi')]);
    // Kofi writes in the stirred-tank notebook, where Jun reads; he is not a member of the shallow-lake one.
    stirredTank = await demoNotebookId('stirredTank');
    shallowLake = await demoNotebookId('shallowLake');
  });
  afterAll(closeLogServer);

  it('creates an entry with an empty revision #1 and records the audit event', async () => {
    const res = await kofi.post(`/api/notebooks/${stirredTank}/entries`, { title: 'Ignition branch, first look', entryDate: '2026-11-02', tags: ['cstr', 'ignition', 'CSTR'] });
    expect(res.status).toBe(201);
    const detail = entryDetailSchema.parse(res.body);
    expect(detail.entry).toMatchObject({ title: 'Ignition branch, first look', entryDate: '2026-11-02', tags: ['cstr', 'ignition'], status: 'draft', revisionCount: 1, author: { name: 'Kofi Mensah' } });
    expect(detail.head).toMatchObject({ number: 1, parentId: null, document: { type: 'doc' }, outputs: {} });
    expect(detail.head.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(detail.entry.headRevisionId).toBe(detail.head.id);
    expect(detail.draft).toBeNull();
    const events = await auditActionsFor(detail.entry.id);
    expect(events).toContain('entry.created');
  });

  it('lists entries newest first and filters by search text, status, author, tag and dates', async () => {
    const make = (c: Client, title: string, entryDate: string, tags: string[]) =>
      c.post(`/api/notebooks/${stirredTank}/entries`, { title, entryDate, tags }).then((r) => (r.body as EntryDetail).entry.id);
    await make(kofi, 'Quenchmark: extinction vs residence time', '2030-11-05', ['extinction']);
    const older = await make(ines, 'Planning the heat-loss study', '2030-10-20', ['planning-2030']);
    // Text in the body is searchable once recorded.
    const detail = (await kofi.get(`/api/notebooks/${stirredTank}/entries/${older}`)).body as EntryDetail;
    await ines.post(`/api/notebooks/${stirredTank}/entries/${older}/revisions`, {
      baseRevisionId: detail.head.id, title: detail.head.title, entryDate: detail.head.entryDate, tags: detail.head.tags, document: paragraphDoc('Jacket coolant at 301.5 K'),
    });

    const all: EntryList = entryListSchema.parse((await jun.get(`/api/notebooks/${stirredTank}/entries`)).body);
    const dates = all.entries.map((e) => e.entryDate);
    expect(dates).toEqual([...dates].sort().reverse());
    expect(all.entries.length).toBeGreaterThanOrEqual(3);

    const q = async (query: string) => ((await jun.get(`/api/notebooks/${stirredTank}/entries?${query}`)).body as EntryList).entries.map((e) => e.title);
    expect(await q('q=QUENCHMARK')).toEqual(['Quenchmark: extinction vs residence time']);
    expect(await q('q=coolant%20at%20301.5%20k')).toEqual(['Planning the heat-loss study']);
    expect(await q('q=301%255')).toEqual([]);
    expect(await q('tag=PLANNING-2030')).toEqual(['Planning the heat-loss study']);
    expect(await q('from=2030-11-01&to=2030-11-05')).toEqual(['Quenchmark: extinction vs residence time']);
    expect(await q('status=approved&from=2030-01-01')).toEqual([]);
    const inesId = (await ines.user()).id;
    expect(await q(`author=${inesId}&from=2030-01-01`)).toEqual(['Planning the heat-loss study']);
  });

  it('answers bad filters and bad entries with the field and the reason', async () => {
    const bad = await jun.get(`/api/notebooks/${stirredTank}/entries?from=yesterday&status=done`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['from', 'status']);
    const res = await kofi.post(`/api/notebooks/${stirredTank}/entries`, { title: '  ', entryDate: '2026-13-40', tags: ['x'.repeat(41)] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['entryDate', 'tags[0]', 'title']);
  });

  it('lets readers read but not write, and hides other notebooks from non-members', async () => {
    const created = (await kofi.post(`/api/notebooks/${stirredTank}/entries`, { title: 'Reader check', entryDate: '2026-11-06' })).body as EntryDetail;
    expect((await jun.get(`/api/notebooks/${stirredTank}/entries/${created.entry.id}`)).status).toBe(200);
    const write = await jun.post(`/api/notebooks/${stirredTank}/entries`, { title: 'Not allowed', entryDate: '2026-11-06' });
    expect(write.status).toBe(403);
    expect(write.body.error.code).toBe('forbidden');
    const draft = await jun.put(`/api/notebooks/${stirredTank}/entries/${created.entry.id}/draft`, {
      baseRevisionId: created.head.id, title: 'x', entryDate: '2026-11-06', tags: [], document: paragraphDoc('x'), outputs: {},
    });
    expect(draft.status).toBe(403);

    // Kofi is not a member of the shallow-lake notebook: everything there is 404.
    const lakeEntry = (await mira.post(`/api/notebooks/${shallowLake}/entries`, { title: 'Turbid state', entryDate: '2026-11-07' })).body as EntryDetail;
    expect((await kofi.get(`/api/notebooks/${shallowLake}/entries`)).status).toBe(404);
    expect((await kofi.get(`/api/notebooks/${shallowLake}/entries/${lakeEntry.entry.id}`)).status).toBe(404);
    // An entry id from another notebook does not resolve through a notebook one belongs to.
    expect((await kofi.get(`/api/notebooks/${stirredTank}/entries/${lakeEntry.entry.id}`)).status).toBe(404);
    expect((await kofi.get(`/api/notebooks/${stirredTank}/entries/not-a-uuid`)).status).toBe(404);
  });

  it('autosaves a per-person draft, returns it with the entry, and discards it', async () => {
    const created = (await kofi.post(`/api/notebooks/${stirredTank}/entries`, { title: 'Draft check', entryDate: '2026-11-08' })).body as EntryDetail;
    const url = `/api/notebooks/${stirredTank}/entries/${created.entry.id}`;
    const body = { baseRevisionId: created.head.id, title: 'Draft check (editing)', entryDate: '2026-11-08', tags: ['wip'], document: paragraphDoc('half a thought'), outputs: {} };
    const saved = await kofi.put(`${url}/draft`, body);
    expect(saved.status).toBe(200);
    draftSchema.parse(saved.body);
    expect(saved.body).toMatchObject({ baseRevisionId: created.head.id, title: 'Draft check (editing)', tags: ['wip'] });
    const again = await kofi.put(`${url}/draft`, { ...body, document: paragraphDoc('a whole thought') });
    expect(again.status).toBe(200);

    const mine = (await kofi.get(url)).body as EntryDetail;
    expect(mine.draft?.document).toEqual(paragraphDoc('a whole thought'));
    // The draft is Kofi's own: the PI sees the head only.
    expect(((await ines.get(url)).body as EntryDetail).draft).toBeNull();

    // A draft must start from a revision of this very entry.
    const foreign = await kofi.put(`${url}/draft`, { ...body, baseRevisionId: crypto.randomUUID() });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields).toEqual([{ path: 'baseRevisionId', message: 'Not a revision of this entry' }]);

    expect((await kofi.delete(`${url}/draft`)).status).toBe(204);
    expect(((await kofi.get(url)).body as EntryDetail).draft).toBeNull();
  });

  it('refuses a structurally invalid document naming the node path, but saves a cell with bad expressions', async () => {
    const created = (await kofi.post(`/api/notebooks/${stirredTank}/entries`, { title: 'Validation', entryDate: '2026-11-09' })).body as EntryDetail;
    const url = `/api/notebooks/${stirredTank}/entries/${created.entry.id}`;
    const base = { baseRevisionId: created.head.id, title: 'Validation', entryDate: '2026-11-09', tags: [] };
    const broken = { type: 'doc', content: [{ type: 'paragraph' }, { type: 'paragraph', content: [{ type: 'marquee' }] }] };
    const res = await kofi.put(`${url}/draft`, { ...base, document: broken, outputs: {} });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('document.content[1].content[0].type');

    const model = { id: '8c6f3b59-70f4-4c55-9a4f-0d5b8f9a7e21', kind: 'model', input: { name: 'Broken', variables: [{ name: 'x', rhs: 'mu - * x' }], parameters: [], definitions: [] } };
    const ok = await kofi.post(`${url}/revisions`, { ...base, document: { type: 'doc', content: [{ type: 'cell', attrs: model }] }, outputs: {} });
    expect(ok.status).toBe(201);
    expect(ok.body.document.content[0].attrs.input.variables[0].rhs).toBe('mu - * x');
  });
});
