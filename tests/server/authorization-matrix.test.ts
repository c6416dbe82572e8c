import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { updateUser } from '@server/services/users/update-user.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../../seeds/demo-people.ts';
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
