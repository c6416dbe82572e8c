import 'reflect-metadata';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '@server/data-source.ts';
import { runSeed } from '../../seeds/seed.ts';
import { startThrowawayCluster } from './pg-cluster.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

/** API tests: one throwaway cluster for the run, migrated and seeded with the demo once. */
export default async function setup(project: TestProject) {
  const cluster = await startThrowawayCluster();
  try {
    const dataSource = await createDataSource(cluster.databaseUrl, { poolSize: 2 }).initialize();
    await dataSource.runMigrations({ transaction: 'each' });
    await runSeed(dataSource, () => undefined);
    await dataSource.destroy();
  } catch (error) {
    await cluster.stop();
    throw error;
  }
  project.provide('databaseUrl', cluster.databaseUrl);
  return async () => {
    await cluster.stop();
  };
}
