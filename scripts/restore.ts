import 'reflect-metadata';
import path from 'node:path';
import { restoreBackup } from './backup/restore-backup.ts';
import { runBackupCommand } from './backup/run-command.ts';

/**
 * `npm run restore -- <folder> [--force]`: a backup made by `npm run backup` into the empty
 * database at DATABASE_URL and the empty bucket S3_BUCKET. Every object is checked against the
 * manifest and the audit chain is verified afterwards. --force replaces what the database and
 * bucket already hold. Exit code 0 when restored and verified, 1 otherwise (the message says why).
 */
const args = process.argv.slice(2);
const force = args.includes('--force');
const folders = args.filter((a) => a !== '--force');
if (folders.length !== 1 || folders[0].startsWith('-')) {
  console.error('Usage: npm run restore -- <folder> [--force]');
  process.exit(1);
}
await runBackupCommand('Restore', async (target, log) => {
  const report = await restoreBackup(target, path.resolve(folders[0]), { force, log });
  return `Restored ${report.counts.revision} revisions and ${report.objects} objects; the audit chain holds (${report.auditEventsVerified} events).`;
});
