import 'reflect-metadata';
import path from 'node:path';
import type { DataSource, EntityManager } from 'typeorm';
import { createDataSource } from '@server/data-source.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { loadEnvOrExit } from '@server/env.ts';
import { addMember } from '@server/services/members/add-member.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { createUser } from '@server/services/users/create-user.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE, type DemoPersonKey } from './demo-people.ts';

/** What the steps share: the transaction and what earlier steps created. */
export interface SeedState {
  manager: EntityManager;
  people: Partial<Record<DemoPersonKey, UserEntity>>;
  notebooks: Record<string, NotebookEntity>;
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

/** The demo scenario, in order. Later steps (entries, revisions) append here. */
export const SEED_STEPS: SeedStep[] = [
  {
    name: 'people',
    async run(state) {
      for (const [key, p] of Object.entries(DEMO_PEOPLE) as [DemoPersonKey, (typeof DEMO_PEOPLE)[DemoPersonKey]][]) {
        state.people[key] = await createUser({ actor: null, manager: state.manager }, { ...p, via: 'demo seed' });
      }
    },
  },
  {
    name: 'notebooks and memberships',
    async run(state) {
      for (const nb of Object.values(DEMO_NOTEBOOKS)) {
        const [creator, ...others] = nb.members;
        const actor = person(state, creator.person);
        const { notebook } = await createNotebook({ actor, manager: state.manager }, { title: nb.title, description: nb.description });
        for (const m of others) {
          await addMember({ actor, manager: state.manager }, { notebookId: notebook.id, email: person(state, m.person).email, role: m.role });
        }
        state.notebooks[nb.key] = notebook;
      }
    },
  },
];

/** Seeds the demo once: does nothing when the demo administrator already exists. */
export async function runSeed(dataSource: DataSource, log: (line: string) => void = console.log): Promise<boolean> {
  if (await dataSource.manager.exists(UserEntity, { where: { email: DEMO_PEOPLE.admin.email } })) {
    log('Demo data already present: not seeding again.');
    return false;
  }
  await dataSource.transaction(async (manager) => {
    const state: SeedState = { manager, people: {}, notebooks: {} };
    for (const step of SEED_STEPS) {
      await step.run(state);
      log(`Seeded ${step.name}.`);
    }
  });
  return true;
}

const isEntryPoint = process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname);
if (isEntryPoint) {
  const env = loadEnvOrExit();
  const dataSource = await createDataSource(env.DATABASE_URL).initialize();
  try {
    await runSeed(dataSource);
  } finally {
    await dataSource.destroy();
  }
}
