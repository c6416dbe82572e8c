import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conflictResponseSchema, revisionListSchema, revisionSchema, type EntryDetail, type Revision, type RevisionList } from '@shared/api/entries.ts';
import { canonicalJson } from '@shared/cells/hash.ts';
import { auditActionsFor, closeLogServer, demoNotebookId, logServer, paragraphDoc, signIn, startLogServer, type Client } from './entries-support.ts';

describe('revisions API', () => {
  let kofi: Client;
  let mira: Client;
  let ines: Client;
  let jun: Client;
  let notebook: string;

  beforeAll(async () => {
    await startLogServer();
    [kofi, mira, ines, jun] = await Promise.all([signIn('researcher'), signIn('researcher2'), signIn('pi'), signIn('reader')]);
    // The two-gene switch notebook: two researchers who may both edit.
    notebook = await demoNotebookId('geneSwitch');
  });
  afterAll(closeLogServer);

  const newEntry = async (title: string) =>
    (await kofi.post(`/api/notebooks/${notebook}/entries`, { title, entryDate: '2026-11-12', tags: ['switch'] })).body as EntryDetail;
  const save = (who: Client, entryId: string, baseRevisionId: string, text: string, extra: Record<string, unknown> = {}) =>
    who.post(`/api/notebooks/${notebook}/entries/${entryId}/revisions`, {
      baseRevisionId,
      title: 'Repressor switch',
      entryDate: '2026-11-12',
      tags: ['switch'],
      document: paragraphDoc(text),
      outputs: {},
      ...extra,
    });

  it('records each save as a numbered revision with parent, author, message and content hash', async () => {
    const { entry, head } = await newEntry('Repressor switch');
    const res = await save(kofi, entry.id, head.id, 'Nullclines cross three times.', { message: 'First notes' });
    expect(res.status).toBe(201);
    const r2 = revisionSchema.parse(res.body);
    expect(r2).toMatchObject({ number: 2, parentId: head.id, message: 'First notes', author: { name: 'Kofi Mensah' }, entryId: entry.id });
    const expected = createHash('sha256')
      .update(canonicalJson({ title: r2.title, entryDate: r2.entryDate, tags: r2.tags, document: r2.document, outputs: r2.outputs }))
      .digest('hex');
    expect(r2.contentHash).toBe(expected);

    const detail = (await ines.get(`/api/notebooks/${notebook}/entries/${entry.id}`)).body as EntryDetail;
    expect(detail.head.id).toBe(r2.id);
    expect(detail.entry.revisionCount).toBe(2);
    expect(await auditActionsFor(entry.id)).toEqual(['entry.created', 'revision.recorded', 'revision.recorded']);
  });

  it('never lets a stale save overwrite another person’s revision (two sessions)', async () => {
    const { entry, head } = await newEntry('Two editors');
    // Both open revision 1 and autosave drafts on it.
    for (const who of [kofi, mira]) {
      const d = await who.put(`/api/notebooks/${notebook}/entries/${entry.id}/draft`, {
        baseRevisionId: head.id, title: 'Two editors', entryDate: '2026-11-12', tags: [], document: paragraphDoc('draft'), outputs: {},
      });
      expect(d.status).toBe(200);
    }
    const first = await save(mira, entry.id, head.id, 'Mira: the basin boundary is the stable manifold of the saddle.');
    expect(first.status).toBe(201);

    const stale = await save(kofi, entry.id, head.id, 'Kofi: hysteresis loop measured.');
    expect(stale.status).toBe(409);
    const conflict = conflictResponseSchema.parse(stale.body);
    expect(conflict.error.code).toBe('conflict');
    expect(conflict.error.message).toContain('Mira Castellanos');
    expect(conflict.error.current.id).toBe((first.body as Revision).id);
    expect(conflict.error.current.document).toEqual(paragraphDoc('Mira: the basin boundary is the stable manifold of the saddle.'));
    // Kofi's draft survives the refused save.
    expect(((await kofi.get(`/api/notebooks/${notebook}/entries/${entry.id}`)).body as EntryDetail).draft).not.toBeNull();

    // Rebase: save on top of the current head, keeping both texts.
    const rebased = await save(kofi, entry.id, conflict.error.current.id, 'Mira: … stable manifold. Kofi: hysteresis loop measured.');
    expect(rebased.status).toBe(201);
    expect((rebased.body as Revision).parentId).toBe(conflict.error.current.id);
    expect((rebased.body as Revision).number).toBe(3);
    // Recording consumed Kofi's own draft; Mira's recorded save consumed hers.
    expect(((await kofi.get(`/api/notebooks/${notebook}/entries/${entry.id}`)).body as EntryDetail).draft).toBeNull();
  });

  it('lets exactly one of two simultaneous saves on the same base win', async () => {
    const { entry, head } = await newEntry('Race');
    const [a, b] = await Promise.all([save(kofi, entry.id, head.id, 'Kofi wins?'), save(mira, entry.id, head.id, 'Mira wins?')]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const list = (await ines.get(`/api/notebooks/${notebook}/entries/${entry.id}/revisions`)).body as RevisionList;
    expect(list.revisions.map((r) => r.number)).toEqual([2, 1]);
  });

  it('lists the history newest first, returns any old revision, and restores it as a new revision', async () => {
    const { entry, head } = await newEntry('History');
    const r2 = (await save(kofi, entry.id, head.id, 'Version two')).body as Revision;
    const r3 = (await save(mira, entry.id, r2.id, 'Version three')).body as Revision;

    const list: RevisionList = revisionListSchema.parse((await ines.get(`/api/notebooks/${notebook}/entries/${entry.id}/revisions`)).body);
    expect(list.revisions.map((r) => [r.number, r.author.name])).toEqual([[3, 'Mira Castellanos'], [2, 'Kofi Mensah'], [1, 'Kofi Mensah']]);
    expect(list.revisions[0]).not.toHaveProperty('document');

    const old = await ines.get(`/api/notebooks/${notebook}/entries/${entry.id}/revisions/${r2.id}`);
    expect(old.status).toBe(200);
    expect((old.body as Revision).document).toEqual(paragraphDoc('Version two'));

    // Restoring from a stale base is a conflict too.
    const staleRestore = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.id}/revisions/${r2.id}/restore`, { baseRevisionId: r2.id });
    expect(staleRestore.status).toBe(409);
    // Kofi has unsaved work; restoring keeps it (its base goes stale, so saving it will ask to rebase).
    await kofi.put(`/api/notebooks/${notebook}/entries/${entry.id}/draft`, {
      baseRevisionId: r3.id, title: 'History', entryDate: '2026-11-12', tags: [], document: paragraphDoc('unsaved work'), outputs: {},
    });
    const restored = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.id}/revisions/${r2.id}/restore`, { baseRevisionId: r3.id });
    expect(restored.status).toBe(201);
    expect(restored.body as Revision).toMatchObject({ number: 4, parentId: r3.id, restoredFromId: r2.id, message: 'Restored revision 2', document: paragraphDoc('Version two') });
    expect((restored.body as Revision).contentHash).toBe(r2.contentHash);
    expect(await auditActionsFor(entry.id)).toContain('revision.restored');
    const afterRestore = (await kofi.get(`/api/notebooks/${notebook}/entries/${entry.id}`)).body as EntryDetail;
    expect(afterRestore.draft).toMatchObject({ baseRevisionId: r3.id, document: paragraphDoc('unsaved work') });
    expect(afterRestore.head.id).toBe((restored.body as Revision).id);

    // Jun is not a member of this notebook: 404; unknown revisions are 404 too.
    expect((await jun.post(`/api/notebooks/${notebook}/entries/${entry.id}/revisions/${r2.id}/restore`, { baseRevisionId: r3.id })).status).toBe(404);
    expect((await ines.get(`/api/notebooks/${notebook}/entries/${entry.id}/revisions/${crypto.randomUUID()}`)).status).toBe(404);
  });

  it('keeps revisions immutable in the database', async () => {
    const { head } = await newEntry('Immutable');
    await expect(logServer().dataSource.query(`UPDATE revision SET title = 'changed' WHERE id = $1`, [head.id])).rejects.toThrow(/immutable/);
  });

  it('drops outputs of cells that are no longer in the document, and checks outputs', async () => {
    const { entry, head } = await newEntry('Outputs');
    const output = { inputHash: 'a'.repeat(64), engineVersion: '1.0.0', computedAt: new Date().toISOString(), status: 'error', error: { code: 'expression_syntax', message: 'x' }, elapsedMs: 1 };
    const orphan = await save(kofi, entry.id, head.id, 'No cells here', { outputs: { [crypto.randomUUID()]: output } });
    expect(orphan.status).toBe(201);
    expect((orphan.body as Revision).outputs).toEqual({});
    const bad = await save(kofi, entry.id, (orphan.body as Revision).id, 'Bad output', { outputs: { [crypto.randomUUID()]: { ...output, inputHash: 'nope' } } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toMatch(/^outputs\..+\.inputHash$/);
  });

  it('answers a missing base revision with the field name', async () => {
    const { entry } = await newEntry('Missing base');
    const res = await kofi.post(`/api/notebooks/${notebook}/entries/${entry.id}/revisions`, { title: 'x', entryDate: '2026-11-12', tags: [], document: paragraphDoc('x') });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['baseRevisionId']);
  });
});
