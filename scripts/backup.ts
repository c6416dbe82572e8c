import 'reflect-metadata';
import path from 'node:path';
import { createBackup } from './backup/create-backup.ts';
import { runBackupCommand } from './backup/run-command.ts';

/**
 * `npm run backup -- <folder>`: the database at DATABASE_URL (pg_dump, custom format) and every
 * object of the S3 bucket into a new or empty folder, with manifest.json. Exit code 0 when done,
 * 1 when the backup could not be made (the message says why).
 */
const folder = process.argv[2];
if (!folder || process.argv.length > 3) {
  console.error('Usage: npm run backup -- <folder>   (a new or empty folder)');
  process.exit(1);
}
await runBackupCommand('Backup', async (target, log) => {
  const manifest = await createBackup(target, path.resolve(folder), log);
  return `Backup written to ${path.resolve(folder)}: the database (${manifest.counts.revision} revisions, ${manifest.counts.audit_event} audit events) and ${manifest.objects.length} objects.`;
});
