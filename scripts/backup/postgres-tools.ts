import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import type pg from 'pg';
import { findPostgresTool } from '../postgres/postgres-cluster.ts';
import { BackupError } from './backup-manifest.ts';

const run = promisify(execFile);

/** The server's version ("15.14") and major version (15). */
export async function serverVersion(client: pg.Client): Promise<{ version: string; major: number }> {
  const { rows } = await client.query<{ server_version: string; server_version_num: string }>(
    `SELECT current_setting('server_version') AS server_version, current_setting('server_version_num') AS server_version_num`,
  );
  return { version: rows[0].server_version.split(' ')[0], major: Math.floor(Number(rows[0].server_version_num) / 10_000) };
}

/**
 * Runs pg_dump or pg_restore of the server's major version against `databaseUrl`. The password
 * goes in PGPASSWORD, never on the command line (where other users could read it in `ps`), and
 * errors quote the tool's own message without the address.
 */
export async function runPostgresTool(name: 'pg_dump' | 'pg_restore', major: number, databaseUrl: string, args: string[]): Promise<void> {
  const tool = findPostgresTool(name, major);
  const url = new URL(databaseUrl);
  const password = decodeURIComponent(url.password);
  url.password = '';
  try {
    await run(tool, [...args, `--dbname=${url.toString()}`], { env: { ...process.env, PGPASSWORD: password }, maxBuffer: 16 * 1024 * 1024 });
  } catch (error) {
    const e = error as { stderr?: string; code?: number };
    throw new BackupError(`${name} failed (exit ${e.code ?? '?'}): ${(e.stderr ?? '').trim() || 'no message'}`);
  }
}
