import type { Response } from 'supertest';
import type { DocumentJson } from '@shared/editor/document.ts';
import { closeAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE, type DemoNotebookKey, type DemoPersonKey } from '../../seeds/demo-people.ts';
import { createTestApp, signIn as signInAgent, type Agent, type TestApp } from '../support/test-app.ts';

/** Shared set-up of the research-log API tests: the real app, signed-in demo people, the demo notebooks. */
let testApp: TestApp | null = null;

export async function startLogServer(): Promise<TestApp> {
  testApp = await createTestApp();
  return testApp;
}

export function logServer(): TestApp {
  if (!testApp) throw new Error('startLogServer() first');
  return testApp;
}

export async function closeLogServer(): Promise<void> {
  await closeAnalysisPool();
  await testApp?.close();
  testApp = null;
}

/** A signed-in person: JSON calls with the session cookie and CSRF token. */
export interface Client {
  agent: Agent;
  get(url: string): Promise<Response>;
  post(url: string, body?: unknown): Promise<Response>;
  put(url: string, body?: unknown): Promise<Response>;
  delete(url: string): Promise<Response>;
  user(): Promise<UserEntity>;
}

export async function signIn(key: DemoPersonKey): Promise<Client> {
  const app = logServer();
  const { agent, csrf } = await signInAgent(app.app, DEMO_PEOPLE[key]);
  return {
    agent,
    get: (url) => agent.get(url),
    post: (url, body) => agent.post(url).set('x-csrf-token', csrf).send(body as object),
    put: (url, body) => agent.put(url).set('x-csrf-token', csrf).send(body as object),
    delete: (url) => agent.delete(url).set('x-csrf-token', csrf),
    user: () => app.dataSource.manager.findOneByOrFail(UserEntity, { email: DEMO_PEOPLE[key].email }),
  };
}

/** The id of a demo notebook (seeded once for the run; see seeds/demo-people.ts for its members). */
export async function demoNotebookId(key: DemoNotebookKey): Promise<string> {
  const notebook = await logServer().dataSource.manager.findOneByOrFail(NotebookEntity, { title: DEMO_NOTEBOOKS[key].title });
  return notebook.id;
}

/** Audit actions recorded about an entry (the entry itself, its revisions and its cells). */
export async function auditActionsFor(entryId: string): Promise<string[]> {
  const rows = (await logServer().dataSource.query(
    `SELECT action FROM audit_event WHERE entity_id = $1 OR summary->>'entryId' = $1 ORDER BY seq`,
    [entryId],
  )) as { action: string }[];
  return rows.map((r) => r.action);
}

export function paragraphDoc(text: string): DocumentJson {
  return { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text }] }] };
}

/** The scalar saddle-node x' = μ − x² as a model cell, with a branch cell that follows it in μ. */
export const SADDLE_MODEL_CELL_ID = '2f0e7a4c-3c1b-4e0e-9d7a-6a1f5b2c8d01';
export const SADDLE_BRANCH_CELL_ID = '9b3d6e2a-7f14-4c2b-8e5d-1a2b3c4d5e6f';
export const saddleModel = { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] };
export const saddleBranchTask = { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } };

export function saddleDoc(note = 'The saddle-node normal form.'): DocumentJson {
  return {
    type: 'doc',
    content: [
      { type: 'paragraph', content: [{ type: 'text', text: note }] },
      { type: 'cell', attrs: { id: SADDLE_MODEL_CELL_ID, kind: 'model', input: { name: 'Saddle-node', ...saddleModel } } },
      { type: 'cell', attrs: { id: SADDLE_BRANCH_CELL_ID, kind: 'branch', input: { modelCellId: SADDLE_MODEL_CELL_ID, task: saddleBranchTask } } },
    ],
  };
}

/**
 * A stiff decay over a very long span: an explicit integrator's stable step is about 3e-5 here
 * (common practice: the stability limit of explicit Runge-Kutta methods), so 1e9 time units would
 * need ~1e13 steps. It runs until its budget or the pool's hard limit stops it.
 */
export const RUNAWAY_REQUEST = {
  model: { variables: [{ name: 'x', rhs: '-100000 * (x - 1)' }], parameters: [], definitions: [] },
  task: { kind: 'simulate', initial: { x: 0 }, time: { start: 0, end: 1e9, samples: 100 }, tolerance: { relative: 1e-12, absolute: 1e-14 } },
};
