import 'reflect-metadata';
import path from 'node:path';
import type { DataSource, EntityManager } from 'typeorm';
import { createDataSource } from '@server/data-source.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { loadEnvOrExit } from '@server/env.ts';
import { addMember } from '@server/services/members/add-member.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { createUser } from '@server/services/users/create-user.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE, type DemoNotebookKey, type DemoPersonKey } from './demo-people.ts';
import { inProcessPool } from './scenario/in-process-pool.ts';
import { seedScenarioEntries, type ScenarioDeps } from './scenario/record-entries.ts';
import { seedFilesAndFigures } from './scenario/files.ts';
import { seedReviewsAndComments } from './scenario/reviews.ts';
import { DEMO_SCENARIOS } from './scenario/index.ts';

/** What the steps share: the transaction and what earlier steps created. */
export interface SeedState {
  manager: EntityManager;
  people: Partial<Record<DemoPersonKey, UserEntity>>;
  notebooks: Partial<Record<DemoNotebookKey, NotebookEntity>>;
}

export interface SeedStep {
  name: string;
  run(state: SeedState): Promise<void>;
}

const person = (state: SeedState, key: DemoPersonKey): UserEntity => {
  const user = state.people[key];
  if (!user) throw new Error(`Seed step order: ${key} does not exist yet`);
  return user;
};

/** The demo group and its notebooks, in order, in one transaction (the research record follows in runSeed). */
export const SEED_STEPS: SeedStep[] = [
  {
    name: 'people',
    async run(state) {
      for (const [key, p] of Object.entries(DEMO_PEOPLE) as [
        DemoPersonKey,
        (typeof DEMO_PEOPLE)[DemoPersonKey],
      ][]) {
        state.people[key] = await createUser(
          { actor: null, manager: state.manager },
          { ...p, via: 'demo seed' },
        );
      }
    },
  },
  {
    name: 'notebooks and memberships',
    async run(state) {
      for (const nb of Object.values(DEMO_NOTEBOOKS)) {
        const [creator, ...others] = nb.members;
        const actor = person(state, creator.person);
        const { notebook } = await createNotebook(
          { actor, manager: state.manager },
          { title: nb.title, description: nb.description },
        );
        for (const m of others) {
          await addMember(
            { actor, manager: state.manager },
            { notebookId: notebook.id, email: person(state, m.person).email, role: m.role },
          );
        }
        state.notebooks[nb.key] = notebook;
      }
    },
  },
];

export interface SeedOptions {
  /** The address people open (links in the review and comment mails). */
  publicUrl?: string;
  /** The seed date: entries are dated in the days before it (default: now). */
  today?: Date;
  /** File storage for the demo's attachment and figures (left out when not given). */
  storage?: FileStorage;
}

/**
 * Seeds the demo once: does nothing when the demo administrator already exists.
 *
 * People and notebooks are written in one transaction. The research record follows, through the
 * same services the API uses, each operation in its own transaction as in the app: cells are run
 * by the run service (which stores each result and audits the run), revisions recorded on top of
 * those stored results, then reviews, a signature and comments, then the invented readings with
 * (given file storage) their CSV attachment and figures. Engine runs happen on this thread (see
 * scenario/in-process-pool.ts). Review and comment mails go to the outbox like any others.
 */
export async function runSeed(
  dataSource: DataSource,
  log: (line: string) => void = console.log,
  options: SeedOptions = {},
): Promise<boolean> {
  if (await dataSource.manager.exists(UserEntity, { where: { email: DEMO_PEOPLE.admin.email } })) {
    log('Demo data already present: not seeding again.');
    return false;
  }
  const state = await dataSource.transaction(async (manager) => {
    const state: SeedState = { manager, people: {}, notebooks: {} };
    for (const step of SEED_STEPS) {
      await step.run(state);
      log(`Seeded ${step.name}.`);
    }
    return state;
  });
  const deps: ScenarioDeps = {
    dataSource,
    pool: inProcessPool(),
    publicUrl:
      options.publicUrl ?? process.env.PUBLIC_URL ?? `http://127.0.0.1:${process.env.PORT ?? '4800'}`,
    people: Object.fromEntries(
      (Object.keys(DEMO_PEOPLE) as DemoPersonKey[]).map((key) => [key, person(state, key)]),
    ) as ScenarioDeps['people'],
    notebooks: state.notebooks as ScenarioDeps['notebooks'],
    today: options.today ?? new Date(),
    ...(options.storage ? { storage: options.storage } : {}),
  };
  try {
    const entries = await seedScenarioEntries(deps, DEMO_SCENARIOS());
    log(`Seeded ${entries.size} entries with their revisions and cell runs.`);
    await seedReviewsAndComments(deps, entries);
    log('Seeded reviews, a signature and comments.');
    const { figures } = await seedFilesAndFigures(deps, entries);
    log(
      figures
        ? `Seeded the demo readings, their attachment and ${figures} figures.`
        : 'Seeded the demo readings (no file storage: no attachment or figures).',
    );
  } catch (error) {
    log('The demo seed stopped part-way; the demo people and notebooks exist, some entries may be missing.');
    throw error;
  }
  return true;
}

const isEntryPoint =
  process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname);
if (isEntryPoint) {
  const env = loadEnvOrExit();
  const dataSource = await createDataSource(env.DATABASE_URL).initialize();
  try {
    await runSeed(dataSource, console.log, { publicUrl: env.PUBLIC_URL });
  } finally {
    await dataSource.destroy();
  }
}
