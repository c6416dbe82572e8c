/**
 * HTTP load: the real server under many signed-in researchers at once, with autocannon.
 *
 * Self-contained: a throwaway PostgreSQL cluster, S3 fake and SMTP sink on free ports, the
 * migrations and the demo seed (tests/support/throwaway-stack.ts, as the browser tests use), then
 * N new people (default 50), each a researcher in every demo notebook, each signed in with its own
 * session cookie and CSRF token. The server runs as a child process (`node --import tsx
 * server/index.ts`, as in production): autocannon parses every response in JavaScript, and on the
 * server's event loop that work would be counted in the server's latencies and take turns with it.
 *
 * Each connection is one person and loops over: list notebooks, list a notebook's entries, read an
 * entry, run a small analysis (a continuation of a two-variable model, about 250 points) in a cell of
 * its own on an entry it may write. One parameter of the model changes per run: a share of the runs
 * (default 25 %) use a value never seen before and compute; the others pick from a few values
 * that are computed once and then answered from the store of earlier runs.
 *
 * Reports requests, requests/s, errors (non-2xx and timeouts; the goal is none), latency p50/p90/p99
 * overall and per kind of request, and what the runs did (computed, from the store, error outputs).
 * Speaks only HTTP to the server: a run answered 2xx counts as served, whatever the way the server
 * schedules it.
 */
import 'reflect-metadata';
import { randomBytes, randomUUID } from 'node:crypto';
import autocannon from 'autocannon';
import type { DataSource } from 'typeorm';
import { createDataSource } from '@server/data-source.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { addMember } from '@server/services/members/add-member.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../seeds/demo-people.ts';
import { makeUser, type TestPerson } from '../tests/support/factories.ts';
import { spawnServer } from '../tests/support/server-process.ts';
import { startThrowawayStack } from '../tests/support/throwaway-stack.ts';
import { printTable } from './report.ts';

export interface HttpLoadOptions {
  /** Length of the measured run, in seconds. */
  seconds: number;
  /** Signed-in people, one connection each. */
  clients: number;
  /** Share of analysis runs that ask for a parameter value never computed before. */
  missShare: number;
}

/** A response slower than this counts as a timeout (an error). */
const TIMEOUT_SECONDS = 10;
/** Parameter values the cached runs choose from (each computed once, then served from the store). */
const CACHED_VALUES = [0.3, 0.4, 0.5, 0.6, 0.7, 0.8];

type Kind = 'list notebooks' | 'list entries' | 'read entry' | 'run analysis';
const KINDS: Kind[] = ['list notebooks', 'list entries', 'read entry', 'run analysis'];
const READS: Kind[] = ['list notebooks', 'list entries', 'read entry'];

interface Session {
  email: string;
  cookie: string;
  csrf: string;
  notebookId: string;
  /** The entry this person reads. */
  readEntryId: string;
  /** The entry (in a notebook where they are a researcher) whose cell they run. */
  runEntryId: string;
  /** Their own cell: runs by different people never supersede one another. */
  cellId: string;
}

/** What one run of the model asks the engine: an S-shaped branch with two folds, ~250 points. */
function analysisRequest(coupling: number): string {
  return JSON.stringify({
    model: {
      variables: [
        { name: 'x', rhs: 'mu + x - x^3 - a*y' },
        { name: 'y', rhs: 'x - y' },
      ],
      parameters: [
        { name: 'mu', value: -3 },
        { name: 'a', value: coupling },
      ],
    },
    task: {
      kind: 'continuation',
      parameter: 'mu',
      start: { x: -1.6, y: -1.6 },
      bounds: { min: -3, max: 3 },
      maxPoints: 250,
      direction: 'increasing',
      step: { initial: 0.02, min: 1e-6, max: 0.05 },
    },
  });
}

const percentile = (sorted: number[], p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] : NaN);
const ms = (v: number) => (Number.isFinite(v) ? `${v.toFixed(v < 10 ? 1 : 0)} ms` : '—');

/** The cookie pairs (name=value) of a response's Set-Cookie headers, merged into `jar`. */
function mergeCookies(jar: string, res: Response): string {
  const pairs = new Map(jar ? jar.split('; ').map((p) => [p.slice(0, p.indexOf('=')), p] as const) : []);
  for (const line of res.headers.getSetCookie()) {
    const pair = line.split(';')[0];
    pairs.set(pair.slice(0, pair.indexOf('=')), pair);
  }
  return [...pairs.values()].join('; ');
}

async function signIn(baseUrl: string, person: TestPerson): Promise<{ cookie: string; csrf: string }> {
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  let cookie = mergeCookies('', csrfRes);
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie },
    body: JSON.stringify({ email: person.email, password: person.password }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${person.email} failed: ${res.status} ${await res.text()}`);
  cookie = mergeCookies(cookie, res);
  return { cookie, csrf: csrfToken };
}

async function getJson<T>(baseUrl: string, cookie: string, url: string): Promise<T> {
  const res = await fetch(`${baseUrl}${url}`, { headers: { cookie, accept: 'application/json' } });
  if (!res.ok) throw new Error(`GET ${url}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

/** N new people, each a researcher in every demo notebook (added by the demo PI, as in the app). */
async function addResearchers(dataSource: DataSource, count: number): Promise<TestPerson[]> {
  const pi = await dataSource.manager.findOneByOrFail(UserEntity, { email: DEMO_PEOPLE.pi.email });
  const titles = Object.values(DEMO_NOTEBOOKS).map((n) => n.title);
  const notebooks = await Promise.all(titles.map((title) => dataSource.manager.findOneByOrFail(NotebookEntity, { title })));
  const people: TestPerson[] = [];
  for (let i = 0; i < count; i++) {
    const person = await makeUser(dataSource, { label: `load${i + 1}` });
    await dataSource.transaction(async (manager) => {
      for (const nb of notebooks) await addMember({ actor: pi, manager }, { notebookId: nb.id, email: person.email, role: 'researcher' });
    });
    people.push(person);
  }
  return people;
}

/** Signs everyone in (a few at a time) and picks, per person, a notebook, an entry to read and one to run in. */
async function openSessions(baseUrl: string, people: TestPerson[]): Promise<Session[]> {
  const sessions: Session[] = [];
  for (let i = 0; i < people.length; i += 10) {
    const batch = people.slice(i, i + 10);
    sessions.push(
      ...(await Promise.all(
        batch.map(async (person, j) => {
          const n = i + j;
          const { cookie, csrf } = await signIn(baseUrl, person);
          const { notebooks } = await getJson<{ notebooks: { id: string; role: string }[] }>(baseUrl, cookie, '/api/notebooks');
          const notebook = notebooks[n % notebooks.length];
          const { entries } = await getJson<{ entries: { id: string }[] }>(baseUrl, cookie, `/api/notebooks/${notebook.id}/entries`);
          if (!entries.length || notebook.role !== 'researcher') throw new Error(`${person.email}: no entry to write in notebook ${notebook.id}`);
          const entry = entries[n % entries.length];
          return { email: person.email, cookie, csrf, notebookId: notebook.id, readEntryId: entry.id, runEntryId: entries[(n + 1) % entries.length].id, cellId: randomUUID() };
        }),
      )),
    );
  }
  return sessions;
}

interface Tally {
  latencies: Record<Kind, number[]>;
  statuses: Record<Kind, Map<number, number>>;
  timeouts: Record<Kind, number>;
  /** Error codes of non-2xx answers (e.g. 503 analysis_busy), with counts. */
  errorCodes: Map<string, number>;
  runs: { computed: number; fromStore: number; errorOutputs: number; unknown: number; freshAsked: number };
}

/** Requests of one connection (one person), with what they answer counted in `tally`. */
function requestsFor(session: Session, tally: Tally, missShare: number, next: { value: number }) {
  const headers = { cookie: session.cookie, 'x-csrf-token': session.csrf, accept: 'application/json', 'content-type': 'application/json' };
  const state: { answered: Kind | null; pending: Kind } = { answered: null, pending: 'list notebooks' };
  const request = (kind: Kind, props: Partial<autocannon.Request>): autocannon.Request => ({
    headers,
    ...props,
    setupRequest: (req) => {
      state.pending = kind;
      return props.setupRequest && typeof props.setupRequest === 'function' ? props.setupRequest(req, {}) : req;
    },
    onResponse: (status, body) => {
      state.answered = kind;
      if (status < 200 || status > 299) {
        let code = `${status}`;
        try {
          code = `${status} ${(JSON.parse(body) as { error?: { code?: string } }).error?.code ?? ''}`.trim();
        } catch {
          // not JSON: the status alone
        }
        tally.errorCodes.set(`${kind}: ${code}`, (tally.errorCodes.get(`${kind}: ${code}`) ?? 0) + 1);
      } else if (kind === 'run analysis') {
        try {
          const output = JSON.parse(body) as { cached?: boolean; status?: string };
          if (output.status === 'error') tally.runs.errorOutputs += 1;
          else if (output.cached === true) tally.runs.fromStore += 1;
          else if (output.cached === false) tally.runs.computed += 1;
          else tally.runs.unknown += 1;
        } catch {
          tally.runs.unknown += 1;
        }
      }
    },
  });
  const base = `/api/notebooks/${session.notebookId}`;
  const requests = [
    request('list notebooks', { method: 'GET', path: '/api/notebooks' }),
    request('list entries', { method: 'GET', path: `${base}/entries` }),
    request('read entry', { method: 'GET', path: `${base}/entries/${session.readEntryId}` }),
    request('run analysis', {
      method: 'POST',
      path: `${base}/entries/${session.runEntryId}/cells/${session.cellId}/run`,
      setupRequest: (req) => {
        const fresh = Math.random() < missShare;
        if (fresh) tally.runs.freshAsked += 1;
        // A fresh value differs from every other one by its last digits; a cached one is one of a few.
        const value = fresh ? 0.35 + (next.value++ % 1_000_000) * 1e-7 : CACHED_VALUES[Math.floor(Math.random() * CACHED_VALUES.length)];
        return { ...req, body: analysisRequest(value) };
      },
    }),
  ];
  return { requests, state };
}

export async function runHttpLoadBench(options: HttpLoadOptions): Promise<{ ok: boolean }> {
  const started = performance.now();
  const stack = await startThrowawayStack({
    database: 'bifolio_load',
    variables: { NODE_ENV: 'production', SESSION_SECRET: randomBytes(32).toString('hex') },
  });
  try {
    const baseUrl = stack.env.PUBLIC_URL;
    const dataSource = await createDataSource(stack.env.DATABASE_URL, { poolSize: 2 }).initialize();
    const people = await addResearchers(dataSource, options.clients).finally(() => dataSource.destroy());
    const server = await spawnServer(stack.variables, { port: stack.env.PORT });
    stack.onStop(() => server.kill('SIGTERM'));
    const sessions = await openSessions(baseUrl, people);
    console.log(
      `\nHTTP load: ${options.clients} signed-in researchers, ${options.seconds} s, server at ${baseUrl} (child process ${server.pid}); set up in ${((performance.now() - started) / 1000).toFixed(1)} s`,
    );

    const tally: Tally = {
      latencies: Object.fromEntries(KINDS.map((k) => [k, []])) as unknown as Tally['latencies'],
      statuses: Object.fromEntries(KINDS.map((k) => [k, new Map()])) as unknown as Tally['statuses'],
      timeouts: Object.fromEntries(KINDS.map((k) => [k, 0])) as Record<Kind, number>,
      errorCodes: new Map(),
      runs: { computed: 0, fromStore: 0, errorOutputs: 0, unknown: 0, freshAsked: 0 },
    };
    const next = { value: 0 };
    let connection = 0;
    const result = await autocannon({
      url: baseUrl,
      connections: options.clients,
      duration: options.seconds,
      timeout: TIMEOUT_SECONDS,
      setupClient: (client) => {
        const session = sessions[connection++ % sessions.length];
        const { requests, state } = requestsFor(session, tally, options.missShare, next);
        client.setRequests(requests);
        // "response" follows the request's onResponse for the same answer (one request in flight per connection).
        client.on('response', (status, _bytes, responseTime) => {
          const kind = state.answered ?? state.pending;
          tally.latencies[kind].push(responseTime);
          tally.statuses[kind].set(status, (tally.statuses[kind].get(status) ?? 0) + 1);
          state.answered = null;
        });
        (client as NodeJS.EventEmitter).on('timeout', () => (tally.timeouts[state.pending] += 1));
      },
    });

    const errors = result.non2xx + result.errors;
    const row = (label: string, kinds: Kind[]) => {
      const lat = kinds.flatMap((k) => tally.latencies[k]).sort((a, b) => a - b);
      const non2xx = kinds.reduce((sum, k) => sum + [...tally.statuses[k]].filter(([s]) => s < 200 || s > 299).reduce((n, [, c]) => n + c, 0), 0);
      const timeouts = kinds.reduce((sum, k) => sum + tally.timeouts[k], 0);
      return [label, `${lat.length}`, `${(lat.length / result.duration).toFixed(1)}`, `${non2xx}`, `${timeouts}`, ms(percentile(lat, 50)), ms(percentile(lat, 90)), ms(percentile(lat, 99))];
    };
    printTable(
      ['requests', 'answered', 'per s', 'non-2xx', 'timeouts', 'p50', 'p90', 'p99'],
      [...KINDS.map((k) => row(k, [k])), row('reads (all three)', READS), row('analysis runs', ['run analysis']), row('all', KINDS)],
    );
    const r = tally.runs;
    const served = r.computed + r.fromStore;
    console.log(
      `Totals (autocannon): ${result.requests.sent} sent, ${result['2xx']} answered 2xx, ${(result['2xx'] / result.duration).toFixed(1)} requests/s over ${result.duration.toFixed(1)} s; ` +
        `non-2xx ${result.non2xx}, connection errors ${result.errors - result.timeouts}, timeouts (> ${TIMEOUT_SECONDS} s) ${result.timeouts}.`,
    );
    console.log(
      `Analysis runs: ${served} served, ${r.computed} computed (${served ? ((r.computed / served) * 100).toFixed(1) : '0'} %) and ${r.fromStore} from the store of earlier runs; ` +
        `${r.freshAsked} asked with a never-computed value (target ${(options.missShare * 100).toFixed(0)} %); ${r.errorOutputs} error outputs${r.unknown ? `, ${r.unknown} answers without a cached flag` : ''}.`,
    );
    if (tally.errorCodes.size) console.log(`Non-2xx answers: ${[...tally.errorCodes].map(([code, n]) => `${code} × ${n}`).join(', ')}`);
    const ok = errors === 0;
    console.log(`${ok ? 'PASS' : 'FAIL'}: ${errors} errors (non-2xx and timeouts) in ${result.requests.sent} requests${ok ? '' : '; the goal is none'}`);
    return { ok };
  } finally {
    await stack.stop();
  }
}
