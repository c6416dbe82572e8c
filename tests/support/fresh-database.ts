import 'reflect-metadata';
import { createDataSource } from '@server/data-source.ts';
import { startThrowawayCluster, type ThrowawayCluster } from './pg-cluster.ts';

/**
 * A throwaway cluster of its own, migrated and without the demo: for tests that stop,
 * kill or restore around a database that no other test file shares.
 */
export async function startMigratedCluster(database: string): Promise<ThrowawayCluster> {
  const cluster = await startThrowawayCluster(database);
  try {
    const dataSource = await createDataSource(cluster.databaseUrl, { poolSize: 1 }).initialize();
    await dataSource.runMigrations({ transaction: 'each' });
    await dataSource.destroy();
  } catch (error) {
    await cluster.stop();
    throw error;
  }
  return cluster;
}
