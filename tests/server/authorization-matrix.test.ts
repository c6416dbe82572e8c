import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { updateUser } from '@server/services/users/update-user.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { SADDLE_BRANCH_CELL_ID, saddleBranchTask, saddleDoc, saddleModel } from './entries-support.ts';
import { createTestApp, makeNotebook, makeUser, newAgent, signIn, uniqueEmail, type Agent, type TestApp, type TestPerson } from '../support/test-app.ts';

/**
 * Every role against every route family. Notebook roles come from a fresh notebook per
 * case; "outsider" is a researcher of a different notebook (cross-notebook access);
 * "admin" is a site administrator who is not a member of the notebook.
 */
type Role = 'anonymous' | 'admin' | 'pi' | 'researcher' | 'reader' | 'outsider';
const ROLES: Role[] = ['anonymous', 'admin', 'pi', 'researcher', 'reader', 'outsider'];

interface Fixture {
  notebookId: string;
  targetUserId: string;
  spare: TestPerson;
}

interface Family {
  name: string;
  call: (agent: Agent, csrf: string, f: Fixture) => Promise<{ status: number; body: unknown }>;
  expected: Record<Role, number>;
}

const notebookMember = (ok: number) => ({ anonymous: 401, admin: 404, pi: ok, researcher: ok, reader: ok, outsider: 404 });
const notebookPi = (ok: number) => ({ anonymous: 401, admin: 404, pi: ok, researcher: 403, reader: 403, outsider: 404 });
const siteAdmin = (ok: number) => ({ anonymous: 401, admin: ok, pi: 403, researcher: 403, reader: 403, outsider: 403 });
const anyoneSignedIn = (ok: number) => ({ anonymous: 401, admin: ok, pi: ok, researcher: ok, reader: ok, outsider: ok });

const FAMILIES: Family[] = [
  { name: 'list own notebooks', call: (a) => a.get('/api/notebooks'), expected: anyoneSignedIn(200) },
  { name: 'create a notebook', call: (a, c) => a.post('/api/notebooks').set('x-csrf-token', c).send({ title: 'Matrix notebook' }), expected: anyoneSignedIn(201) },
  { name: 'read a notebook', call: (a, _c, f) => a.get(`/api/notebooks/${f.notebookId}`), expected: notebookMember(200) },
  { name: 'list members', call: (a, _c, f) => a.get(`/api/notebooks/${f.notebookId}/members`), expected: notebookMember(200) },
  { name: 'update a notebook', call: (a, c, f) => a.patch(`/api/notebooks/${f.notebookId}`).set('x-csrf-token', c).send({ title: 'Renamed' }), expected: notebookPi(200) },
  {
    name: 'add a member',
    call: (a, c, f) => a.post(`/api/notebooks/${f.notebookId}/members`).set('x-csrf-token', c).send({ email: f.spare.email, role: 'reader' }),
    expected: notebookPi(201),
  },
  {
    name: 'change a member role',
    call: (a, c, f) => a.patch(`/api/notebooks/${f.notebookId}/members/${f.targetUserId}`).set('x-csrf-token', c).send({ role: 'researcher' }),
    expected: notebookPi(200),
  },
  { name: 'remove a member', call: (a, c, f) => a.delete(`/api/notebooks/${f.notebookId}/members/${f.targetUserId}`).set('x-csrf-token', c), expected: notebookPi(204) },
  { name: 'list people', call: (a) => a.get('/api/users'), expected: siteAdmin(200) },
  { name: 'update a person', call: (a, c, f) => a.patch(`/api/users/${f.spare.user.id}`).set('x-csrf-token', c).send({ name: 'Changed By Admin' }), expected: siteAdmin(200) },
  { name: 'list invites', call: (a) => a.get('/api/invites'), expected: siteAdmin(200) },
  {
    name: 'create an invite',
    call: (a, c) => a.post('/api/invites').set('x-csrf-token', c).send({ email: uniqueEmail('matrix-invite'), name: 'Matrix Invitee' }),
    expected: siteAdmin(201),
  },
  { name: 'read own account', call: (a) => a.get('/api/auth/me'), expected: anyoneSignedIn(200) },
];

let t: TestApp;
const people = {} as Record<Exclude<Role, 'anonymous'>, TestPerson>;
const agents = {} as Record<Role, { agent: Agent; csrf: string }>;
let target: TestPerson;

beforeAll(async () => {
  t = await createTestApp();
  for (const role of ['admin', 'pi', 'researcher', 'reader', 'outsider'] as const) {
    people[role] = await makeUser(t.dataSource, { label: `matrix-${role}`, siteRole: role === 'admin' ? 'administrator' : 'member' });
    agents[role] = await signIn(t.app, people[role]);
  }
  agents.anonymous = await newAgent(t.app);
  target = await makeUser(t.dataSource, { label: 'matrix-target' });
  await makeNotebook(t.dataSource, people.pi.user, [{ user: people.outsider.user, role: 'researcher' }]);
});
afterAll(async () => {
  await t?.close();
});

const CASES = FAMILIES.flatMap((family) => ROLES.map((role) => ({ family: family.name, role, status: family.expected[role], run: family })));

describe('authorization matrix', () => {
  it.each(CASES)('$family as $role → $status', async ({ role, status, run }) => {
    const notebook = await makeNotebook(t.dataSource, people.pi.user, [
      { user: people.researcher.user, role: 'researcher' },
      { user: people.reader.user, role: 'reader' },
      { user: target.user, role: 'reader' },
    ]);
    const spare = await makeUser(t.dataSource, { label: 'matrix-spare' });
    const { agent, csrf } = agents[role];
    const res = await run.call(agent, csrf, { notebookId: notebook.id, targetUserId: target.user.id, spare });
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    if (status === 404) {
      // A non-member learns nothing about the notebook.
      expect(JSON.stringify(res.body)).not.toContain(notebook.title);
      expect(res.body).toMatchObject({ error: { code: 'not_found' } });
    }
    if (status >= 400) expect(res.body).toHaveProperty('error.code');
  });
});

describe('cross-notebook access with the demo group', () => {
  it('a researcher of two notebooks cannot see, list or change the third (404, never the data)', async () => {
    const lake = await t.dataSource.manager.findOneByOrFail(NotebookEntity, { title: DEMO_NOTEBOOKS.shallowLake.title });
    const { agent, csrf } = await signIn(t.app, DEMO_PEOPLE.researcher);
    const list = await agent.get('/api/notebooks');
    expect(list.body.notebooks.map((n: { title: string }) => n.title)).not.toContain(DEMO_NOTEBOOKS.shallowLake.title);
    for (const res of [
      await agent.get(`/api/notebooks/${lake.id}`),
      await agent.get(`/api/notebooks/${lake.id}/members`),
      await agent.patch(`/api/notebooks/${lake.id}`).set('x-csrf-token', csrf).send({ title: 'Taken over' }),
      await agent.post(`/api/notebooks/${lake.id}/members`).set('x-csrf-token', csrf).send({ email: DEMO_PEOPLE.researcher.email, role: 'pi' }),
    ]) {
      expect(res.status).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain('Shallow lake');
    }
    const unchanged = await t.dataSource.manager.findOneByOrFail(NotebookEntity, { id: lake.id });
    expect(unchanged.title).toBe(DEMO_NOTEBOOKS.shallowLake.title);
  });

  it('the reader sees both notebooks they read, with the reader role', async () => {
    const { agent } = await signIn(t.app, DEMO_PEOPLE.reader);
    const res = await agent.get('/api/notebooks');
    const mine = res.body.notebooks.filter((n: { title: string }) => n.title === DEMO_NOTEBOOKS.stirredTank.title || n.title === DEMO_NOTEBOOKS.shallowLake.title);
    expect(mine.map((n: { role: string }) => n.role)).toEqual(['reader', 'reader']);
  });
});

describe('notebook rules', () => {
  it('the last PI can be neither demoted nor removed (409)', async () => {
    const notebook = await makeNotebook(t.dataSource, people.pi.user);
    const { agent, csrf } = agents.pi;
    const demote = await agent.patch(`/api/notebooks/${notebook.id}/members/${people.pi.user.id}`).set('x-csrf-token', csrf).send({ role: 'reader' });
    expect(demote.status).toBe(409);
    const remove = await agent.delete(`/api/notebooks/${notebook.id}/members/${people.pi.user.id}`).set('x-csrf-token', csrf);
    expect(remove.status).toBe(409);
  });

  it('adding someone without an account names the e-mail field', async () => {
    const notebook = await makeNotebook(t.dataSource, people.pi.user);
    const res = await agents.pi.agent.post(`/api/notebooks/${notebook.id}/members`).set('x-csrf-token', agents.pi.csrf).send({ email: uniqueEmail('ghost'), role: 'reader' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('email');
  });

  it('the last active administrator can be neither demoted nor deactivated (409 naming the field)', async () => {
    // In a transaction that is rolled back: leave exactly one active administrator.
    const runner = t.dataSource.createQueryRunner();
    await runner.connect();
    await runner.startTransaction();
    try {
      const keep = people.admin.user;
      await runner.query(`UPDATE app_user SET site_role = 'member' WHERE site_role = 'administrator' AND id <> $1`, [keep.id]);
      const ctx = { actor: keep, manager: runner.manager };
      await expect(updateUser(ctx, { userId: keep.id, changes: { siteRole: 'member' } })).rejects.toMatchObject({ status: 409, fields: [{ path: 'siteRole' }] });
      await expect(updateUser(ctx, { userId: keep.id, changes: { active: false } })).rejects.toMatchObject({ status: 409, fields: [{ path: 'active' }] });
    } finally {
      await runner.rollbackTransaction();
      await runner.release();
    }
  });
});

// ---------------------------------------------------------------------------------------------
// The research log: every route family added since the foundation.
// ---------------------------------------------------------------------------------------------

const PNG_1x1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64');

/** What a log case needs besides the entry: each is made by the researcher (the entry's author) or the PI. */
type Need = 'review' | 'comment' | 'attachment' | 'measurement' | 'figure';

interface LogFixture {
  notebookId: string;
  entryId: string;
  entryTitle: string;
  /** Revision 1 (the empty start) and the head (revision 2, with the branch cell's result). */
  firstRevisionId: string;
  headId: string;
  commentId?: string;
  attachmentId?: string;
  measurementSetId?: string;
  figureId?: string;
  /** The caller (null when signed out). */
  me: TestPerson | null;
}

interface LogFamily {
  name: string;
  /** A fresh entry per case (the call changes it); otherwise the shared one is read. */
  fresh?: boolean;
  needs?: Need[];
  call: (agent: Agent, csrf: string, f: LogFixture) => Promise<{ status: number; body: unknown }>;
  expected: Record<Role, number>;
}

const notebookWriter = (ok: number) => ({ anonymous: 401, admin: 404, pi: ok, researcher: ok, reader: 403, outsider: 404 });
/** Auditing a notebook: its PIs and administrators (who are told about any notebook), others refused. */
const notebookAudit = (ok: number) => ({ anonymous: 401, admin: ok, pi: ok, researcher: 403, reader: 403, outsider: 404 });

/**
 * The branch task of these tests: results are stored by request, so a task of their own keeps
 * other test files' first runs uncached.
 */
const MATRIX_TASK = { ...saddleBranchTask, bounds: { min: -1, max: 1.75 } };
function matrixDoc() {
  const doc = saddleDoc('Matrix fixture.');
  const content = (doc.content ?? []).map((node) =>
    node.type === 'cell' && node.attrs?.id === SADDLE_BRANCH_CELL_ID ? { ...node, attrs: { ...node.attrs, input: { ...(node.attrs.input as object), task: MATRIX_TASK } } } : node,
  );
  return { ...doc, content };
}

const entryUrl = (f: LogFixture) => `/api/notebooks/${f.notebookId}/entries/${f.entryId}`;
const content = (f: LogFixture, title: string) => ({ baseRevisionId: f.headId, title, entryDate: '2026-11-30', tags: ['matrix'], document: matrixDoc(), outputs: {} });

const LOG_FAMILIES: LogFamily[] = [
  // Entries, drafts, revisions, restore, cell runs
  { name: 'list entries', call: (a, _c, f) => a.get(`/api/notebooks/${f.notebookId}/entries`), expected: notebookMember(200) },
  {
    name: 'create an entry',
    call: (a, c, f) => a.post(`/api/notebooks/${f.notebookId}/entries`).set('x-csrf-token', c).send({ title: 'Matrix entry', entryDate: '2026-11-30' }),
    expected: notebookWriter(201),
  },
  { name: 'read an entry', call: (a, _c, f) => a.get(entryUrl(f)), expected: notebookMember(200) },
  { name: 'save a draft', fresh: true, call: (a, c, f) => a.put(`${entryUrl(f)}/draft`).set('x-csrf-token', c).send(content(f, 'Draft')), expected: notebookWriter(200) },
  { name: 'discard a draft', fresh: true, call: (a, c, f) => a.delete(`${entryUrl(f)}/draft`).set('x-csrf-token', c), expected: notebookWriter(204) },
  {
    name: 'record a revision',
    fresh: true,
    call: (a, c, f) => a.post(`${entryUrl(f)}/revisions`).set('x-csrf-token', c).send(content(f, 'Recorded')),
    expected: notebookWriter(201),
  },
  { name: 'list revisions', call: (a, _c, f) => a.get(`${entryUrl(f)}/revisions`), expected: notebookMember(200) },
  { name: 'read a revision', call: (a, _c, f) => a.get(`${entryUrl(f)}/revisions/${f.firstRevisionId}`), expected: notebookMember(200) },
  {
    name: 'restore a revision',
    fresh: true,
    call: (a, c, f) => a.post(`${entryUrl(f)}/revisions/${f.firstRevisionId}/restore`).set('x-csrf-token', c).send({ baseRevisionId: f.headId }),
    expected: notebookWriter(201),
  },
  {
    name: 'run a cell',
    call: (a, c, f) => a.post(`${entryUrl(f)}/cells/${SADDLE_BRANCH_CELL_ID}/run`).set('x-csrf-token', c).send({ model: saddleModel, task: MATRIX_TASK }),
    expected: notebookWriter(200),
  },
  { name: 'read a run’s progress', call: (a, _c, f) => a.get(`${entryUrl(f)}/cells/${SADDLE_BRANCH_CELL_ID}/run`), expected: notebookMember(200) },
  // Allowed callers are told there is no run to cancel (404); the others never get that far.
  { name: 'cancel a run (none in progress)', call: (a, c, f) => a.delete(`${entryUrl(f)}/cells/${SADDLE_BRANCH_CELL_ID}/run`).set('x-csrf-token', c), expected: notebookWriter(404) },
  {
    name: 'validate a model',
    call: (a, c) => a.post('/api/engine/validate-model').set('x-csrf-token', c).send({ model: saddleModel }),
    expected: anyoneSignedIn(200),
  },
  // Reviews (the entry is the researcher's: the PI may decide, nobody decides on their own work)
  { name: 'submit for review', fresh: true, call: (a, c, f) => a.post(`${entryUrl(f)}/review`).set('x-csrf-token', c).send({ revisionId: f.headId, note: 'Please look' }), expected: notebookWriter(201) },
  { name: 'read a review', needs: ['review'], call: (a, _c, f) => a.get(`${entryUrl(f)}/review`), expected: notebookMember(200) },
  {
    name: 'mark a revision seen',
    fresh: true,
    needs: ['review'],
    call: (a, c, f) => a.post(`${entryUrl(f)}/review/mark-seen`).set('x-csrf-token', c).send({ revisionId: f.headId }),
    expected: { ...notebookPi(200) },
  },
  {
    name: 'request changes',
    fresh: true,
    needs: ['review'],
    call: (a, c, f) => a.post(`${entryUrl(f)}/review/request-changes`).set('x-csrf-token', c).send({ revisionId: f.headId, comment: 'Extend the branch' }),
    expected: notebookPi(200),
  },
  {
    name: 'approve (sign) with the caller’s own password',
    fresh: true,
    needs: ['review'],
    call: (a, c, f) => a.post(`${entryUrl(f)}/review/approve`).set('x-csrf-token', c).send({ revisionId: f.headId, password: f.me?.password ?? 'none' }),
    expected: notebookPi(200),
  },
  { name: 'check reproducibility', needs: ['review'], call: (a, _c, f) => a.get(`${entryUrl(f)}/review/reproducibility`), expected: notebookPi(200) },
  { name: 'read the review queue', call: (a) => a.get('/api/reviews/queue'), expected: anyoneSignedIn(200) },
  // Comments (the thread is the PI's: the entry's author and PIs may resolve it, a reader may not)
  { name: 'list comments', needs: ['comment'], call: (a, _c, f) => a.get(`${entryUrl(f)}/comments`), expected: notebookMember(200) },
  {
    name: 'comment',
    call: (a, c, f) => a.post(`${entryUrl(f)}/comments`).set('x-csrf-token', c).send({ anchor: { revisionId: f.headId }, body: 'A matrix comment' }),
    expected: notebookMember(201),
  },
  {
    name: 'resolve another person’s thread',
    fresh: true,
    needs: ['comment'],
    call: (a, c, f) => a.post(`${entryUrl(f)}/comments/${f.commentId}/resolve`).set('x-csrf-token', c),
    expected: { anonymous: 401, admin: 404, pi: 200, researcher: 200, reader: 403, outsider: 404 },
  },
  // Audit views
  { name: 'audit of a notebook', call: (a, _c, f) => a.get(`/api/audit?notebookId=${f.notebookId}`), expected: notebookAudit(200) },
  { name: 'audit of an entry', call: (a, _c, f) => a.get(`/api/audit?entryId=${f.entryId}`), expected: notebookAudit(200) },
  { name: 'audit of a notebook as CSV', call: (a, _c, f) => a.get(`/api/audit?notebookId=${f.notebookId}&format=csv`), expected: notebookAudit(200) },
  { name: 'the whole audit trail', call: (a) => a.get('/api/audit'), expected: siteAdmin(200) },
  { name: 'one’s own audit trail', call: (a, _c, f) => a.get(`/api/audit?actorId=${f.me?.user.id ?? people.pi.user.id}`), expected: anyoneSignedIn(200) },
  { name: 'another person’s audit trail', call: (a) => a.get(`/api/audit?actorId=${target.user.id}`), expected: siteAdmin(200) },
  { name: 'verify the audit chain', call: (a) => a.get('/api/audit/verify'), expected: siteAdmin(200) },
  // Attachments
  {
    name: 'upload an attachment',
    call: (a, c, f) => a.post(`${entryUrl(f)}/attachments`).set('x-csrf-token', c).attach('file', PNG_1x1, { filename: 'matrix.png', contentType: 'image/png' }),
    expected: notebookWriter(201),
  },
  { name: 'list attachments', needs: ['attachment'], call: (a, _c, f) => a.get(`${entryUrl(f)}/attachments`), expected: notebookMember(200) },
  { name: 'read an attachment', needs: ['attachment'], call: (a, _c, f) => a.get(`${entryUrl(f)}/attachments/${f.attachmentId}`), expected: notebookMember(200) },
  { name: 'download an attachment', needs: ['attachment'], call: (a, _c, f) => a.get(`${entryUrl(f)}/attachments/${f.attachmentId}/content`), expected: notebookMember(302) },
  {
    name: 'remove an attachment',
    fresh: true,
    needs: ['attachment'],
    call: (a, c, f) => a.delete(`${entryUrl(f)}/attachments/${f.attachmentId}`).set('x-csrf-token', c),
    expected: notebookWriter(204),
  },
  // Figures
  {
    name: 'attach a figure',
    call: (a, c, f) => a.post(`${entryUrl(f)}/figures`).set('x-csrf-token', c).send({ revisionId: f.headId, cellId: SADDLE_BRANCH_CELL_ID, caption: 'Matrix' }),
    expected: notebookWriter(201),
  },
  { name: 'list figures', needs: ['figure'], call: (a, _c, f) => a.get(`${entryUrl(f)}/figures`), expected: notebookMember(200) },
  { name: 'read a figure', needs: ['figure'], call: (a, _c, f) => a.get(`${entryUrl(f)}/figures/${f.figureId}`), expected: notebookMember(200) },
  { name: 'download a figure', needs: ['figure'], call: (a, _c, f) => a.get(`${entryUrl(f)}/figures/${f.figureId}/svg`), expected: notebookMember(302) },
  // Measurements
  {
    name: 'import measurements',
    call: (a, c, f) => a.post(`${entryUrl(f)}/measurements`).set('x-csrf-token', c).send({ name: 'Matrix data', csv: 'mu,x\n0.25,0.5\n1,1\n' }),
    expected: notebookWriter(201),
  },
  { name: 'list measurements', needs: ['measurement'], call: (a, _c, f) => a.get(`${entryUrl(f)}/measurements`), expected: notebookMember(200) },
  { name: 'read a measurement set', needs: ['measurement'], call: (a, _c, f) => a.get(`${entryUrl(f)}/measurements/${f.measurementSetId}`), expected: notebookMember(200) },
  // Exports
  { name: 'export cell data', call: (a, _c, f) => a.get(`${entryUrl(f)}/export/cells/${SADDLE_BRANCH_CELL_ID}?format=csv`), expected: notebookMember(200) },
  { name: 'export the printable record', call: (a, _c, f) => a.get(`${entryUrl(f)}/export/record`), expected: notebookMember(200) },
  { name: 'export the archive', call: (a, _c, f) => a.get(`${entryUrl(f)}/export/archive`).responseType('blob'), expected: notebookMember(200) },
  // Search
  { name: 'search', call: (a) => a.get('/api/search?q=saddle'), expected: anyoneSignedIn(200) },
];

let logNotebookId: string;
let branchOutput: unknown;
let shared: LogFixture;

/** A researcher's entry in the log notebook with the branch cell's result as revision 2, plus what `needs` asks. */
async function makeLogFixture(needs: Need[]): Promise<LogFixture> {
  const researcher = agents.researcher;
  const pi = agents.pi;
  const title = `Matrix entry ${uniqueEmail('e')}`;
  const created = await researcher.agent.post(`/api/notebooks/${logNotebookId}/entries`).set('x-csrf-token', researcher.csrf).send({ title, entryDate: '2026-11-30' });
  expect(created.status).toBe(201);
  const entryId = created.body.entry.id as string;
  const firstRevisionId = created.body.head.id as string;
  const base = `/api/notebooks/${logNotebookId}/entries/${entryId}`;
  const saved = await researcher.agent
    .post(`${base}/revisions`)
    .set('x-csrf-token', researcher.csrf)
    .send({ baseRevisionId: firstRevisionId, title, entryDate: '2026-11-30', tags: [], document: matrixDoc(), outputs: { [SADDLE_BRANCH_CELL_ID]: branchOutput } });
  expect(saved.status, JSON.stringify(saved.body)).toBe(201);
  const f: LogFixture = { notebookId: logNotebookId, entryId, entryTitle: title, firstRevisionId, headId: saved.body.id as string, me: null };
  const ok = (res: { status: number; body: unknown }, status: number) => {
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    return res.body as { id: string };
  };
  if (needs.includes('review')) ok(await researcher.agent.post(`${base}/review`).set('x-csrf-token', researcher.csrf).send({ revisionId: f.headId }), 201);
  if (needs.includes('comment')) f.commentId = ok(await pi.agent.post(`${base}/comments`).set('x-csrf-token', pi.csrf).send({ anchor: { revisionId: f.headId }, body: 'PI thread' }), 201).id;
  if (needs.includes('attachment')) {
    const up = await researcher.agent.post(`${base}/attachments`).set('x-csrf-token', researcher.csrf).attach('file', PNG_1x1, { filename: 'fixture.png', contentType: 'image/png' });
    f.attachmentId = ok(up, 201).id;
  }
  if (needs.includes('measurement')) {
    f.measurementSetId = ok(await researcher.agent.post(`${base}/measurements`).set('x-csrf-token', researcher.csrf).send({ name: 'Fixture data', csv: 'mu,x\n0.25,0.5\n' }), 201).id;
  }
  if (needs.includes('figure')) {
    f.figureId = ok(await researcher.agent.post(`${base}/figures`).set('x-csrf-token', researcher.csrf).send({ revisionId: f.headId, cellId: SADDLE_BRANCH_CELL_ID }), 201).id;
  }
  return f;
}

const LOG_CASES = LOG_FAMILIES.flatMap((family) => ROLES.map((role) => ({ family: family.name, role, status: family.expected[role], run: family })));

describe('ASVS V4 access control: the research log, role × route', () => {
  beforeAll(async () => {
    logNotebookId = (
      await makeNotebook(t.dataSource, people.pi.user, [
        { user: people.researcher.user, role: 'researcher' },
        { user: people.reader.user, role: 'reader' },
      ])
    ).id;
    // One run of the branch cell gives the result every fixture's head revision holds.
    const scratch = await agents.researcher.agent
      .post(`/api/notebooks/${logNotebookId}/entries`)
      .set('x-csrf-token', agents.researcher.csrf)
      .send({ title: 'Matrix scratch', entryDate: '2026-11-30' });
    const run = await agents.researcher.agent
      .post(`/api/notebooks/${logNotebookId}/entries/${scratch.body.entry.id}/cells/${SADDLE_BRANCH_CELL_ID}/run`)
      .set('x-csrf-token', agents.researcher.csrf)
      .send({ model: saddleModel, task: MATRIX_TASK });
    expect(run.status, JSON.stringify(run.body)).toBe(200);
    const { cached: _cached, ...output } = run.body as Record<string, unknown>;
    branchOutput = output;
    shared = await makeLogFixture(['review', 'comment', 'attachment', 'measurement', 'figure']);
  });
  afterAll(async () => {
    await closeAnalysisPool();
  });

  it.each(LOG_CASES)('$family as $role → $status', async ({ role, status, run }) => {
    const base = run.fresh ? await makeLogFixture(run.needs ?? []) : shared;
    const f: LogFixture = { ...base, me: role === 'anonymous' ? null : people[role] };
    const { agent, csrf } = agents[role];
    const res = await run.call(agent, csrf, f);
    // The archive is read as bytes; its errors are JSON.
    const body: unknown = Buffer.isBuffer(res.body) ? (res.status >= 400 ? JSON.parse(res.body.toString('utf8')) : null) : res.body;
    expect(res.status, JSON.stringify(body)).toBe(status);
    if (status === 404 && (role === 'admin' || role === 'outsider')) {
      // A non-member learns nothing about the notebook or the entry.
      expect(JSON.stringify(body)).not.toContain(f.entryTitle);
      expect(body).toMatchObject({ error: { code: 'not_found' } });
    }
    if (status >= 400) expect(body).toHaveProperty('error.code');
  });

  it('search finds the log entry for members only', async () => {
    const q = encodeURIComponent(shared.entryTitle);
    for (const role of ROLES.filter((r) => r !== 'anonymous')) {
      const res = await agents[role].agent.get(`/api/search?q=${q}`);
      expect(res.status).toBe(200);
      const ids = (res.body.results as { entryId?: string; entry?: { id: string } }[]).map((r) => r.entryId ?? r.entry?.id);
      expect(ids.includes(shared.entryId), role).toBe(['pi', 'researcher', 'reader'].includes(role));
    }
  });

  it('an entry reached through another notebook’s address is not found (404), even by a member of that notebook', async () => {
    const own = await makeNotebook(t.dataSource, people.outsider.user);
    const { agent, csrf } = agents.outsider;
    const wrong = `/api/notebooks/${own.id}/entries/${shared.entryId}`;
    for (const res of [
      await agent.get(wrong),
      await agent.get(`${wrong}/revisions/${shared.firstRevisionId}`),
      await agent.get(`${wrong}/attachments/${shared.attachmentId}/content`),
      await agent.get(`${wrong}/figures/${shared.figureId}`),
      await agent.get(`${wrong}/measurements/${shared.measurementSetId}`),
      await agent.get(`${wrong}/export/record`),
      await agent.post(`${wrong}/comments`).set('x-csrf-token', csrf).send({ anchor: { revisionId: shared.headId }, body: 'Sneaking in' }),
      await agent.get(`/api/audit?notebookId=${own.id}&entryId=${shared.entryId}`),
    ]) {
      expect(res.status, JSON.stringify(res.body)).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain(shared.entryTitle);
    }
  });
});
