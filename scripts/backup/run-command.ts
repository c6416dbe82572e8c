import { loadEnvOrExit } from '@server/env.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { PostgresSetupError } from '../postgres/postgres-cluster.ts';
import { BackupError } from './backup-manifest.ts';
import type { BackupTarget } from './create-backup.ts';

/**
 * Runs `npm run backup` or `npm run restore` against the database and bucket the environment
 * names: prints the summary `work` returns, or "<label> failed: <why>" with exit code 1.
 */
export async function runBackupCommand(label: 'Backup' | 'Restore', work: (target: BackupTarget, log: (line: string) => void) => Promise<string>): Promise<void> {
  const env = loadEnvOrExit();
  const storage = createS3Storage(env);
  try {
    console.log(await work({ databaseUrl: env.DATABASE_URL, storage, bucket: env.S3_BUCKET }, (line) => console.log(line)));
  } catch (error) {
    if (!(error instanceof BackupError || error instanceof PostgresSetupError)) throw error;
    console.error(`${label} failed: ${error.message}`);
    process.exitCode = 1;
  } finally {
    storage.client.destroy();
  }
}
