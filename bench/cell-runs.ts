/**
 * Cell runs through the API, one at a time: `npm run bench -- runs`.
 * Starts a throwaway PostgreSQL cluster, the S3 fake and the SMTP sink on free ports, the real
 * server in this process, signs in, then times RUNS uncached small equilibria runs (each a
 * different parameter value, so none is answered from the store) one after the other over HTTP.
 * The figure is the median time of one run's request, from POST to answer; the engine's own
 * time for such a run is about a millisecond, so the rest is the cost of the run's path
 * (queue, notification, result storage and audit). Goal: median < 100 ms.
 */
import 'reflect-metadata';
import request from 'supertest';
import { createDataSource } from '@server/data-source.ts';
import { startServer } from '@server/index.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { createUser } from '@server/services/users/create-user.ts';
import { startThrowawayStack } from '../tests/support/throwaway-stack.ts';

const RUNS = 20;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Prints the median time of a small uncached run through the API against its goal. */
export async function runCellRunsBench(): Promise<void> {
  const stack = await startThrowawayStack({ database: 'bifolio_bench', seed: false });
  const { env } = stack;
  const dataSource = await createDataSource(env.DATABASE_URL, { poolSize: 2 }).initialize();
  const person = { email: 'bench@bench.example', password: 'bench-password-1234' };
  const notebookId = await dataSource.transaction(async (manager) => {
    const user = await createUser(
      { actor: null, manager },
      { ...person, name: 'Bench Person', siteRole: 'member', via: 'test' },
    );
    return (await createNotebook({ actor: user, manager }, { title: 'Bench notebook', description: '' }))
      .notebook.id;
  });
  await dataSource.destroy();
  const server = await startServer(env, { sessionPruneSeconds: false });
  stack.onStop(() => server.stop());

  try {
    const agent = request.agent(`http://127.0.0.1:${server.port}`);
    const csrf = ((await agent.get('/api/auth/csrf')).body as { csrfToken: string }).csrfToken;
    await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send(person).expect(200);
    const entry = await agent
      .post(`/api/notebooks/${notebookId}/entries`)
      .set('x-csrf-token', csrf)
      .send({ title: 'Bench', entryDate: '2026-12-01' })
      .expect(201);
    const runUrl = `/api/notebooks/${notebookId}/entries/${(entry.body as { entry: { id: string } }).entry.id}/cells/${crypto.randomUUID()}/run`;
    const body = (mu: number) => ({
      model: {
        variables: [{ name: 'x', rhs: 'mu - x^2' }],
        parameters: [{ name: 'mu', value: mu }],
        definitions: [],
      },
      task: { kind: 'equilibria', box: { x: [-3, 3] }, starts: 8 },
    });
    // Warm-up: the first run loads the engine in a worker thread.
    await agent.post(runUrl).set('x-csrf-token', csrf).send(body(0.5)).expect(200);
    const times: number[] = [];
    const engineTimes: number[] = [];
    for (let i = 0; i < RUNS; i += 1) {
      const started = performance.now();
      const res = await agent
        .post(runUrl)
        .set('x-csrf-token', csrf)
        .send(body(1 + i / 7))
        .expect(200);
      times.push(performance.now() - started);
      const output = res.body as { status: string; cached: boolean; elapsedMs: number };
      if (output.status !== 'ok' || output.cached)
        throw new Error(`run ${i} answered ${JSON.stringify(output).slice(0, 200)}`);
      engineTimes.push(output.elapsedMs);
    }
    const total = times.reduce((a, b) => a + b, 0);
    const ms = median(times);
    console.log(`Bifolio cell runs through the API — Node ${process.version}, ${new Date().toISOString()}`);
    console.log(
      `${RUNS} uncached small equilibria runs, one after the other: total ${total.toFixed(0)} ms, median ${ms.toFixed(1)} ms per run (engine median ${median(engineTimes).toFixed(1)} ms), slowest ${Math.max(...times).toFixed(1)} ms; goal median < 100 ms: ${ms < 100 ? 'yes' : 'NO'}`,
    );
  } finally {
    await stack.stop();
  }
}
