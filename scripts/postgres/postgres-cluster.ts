import { execFile, execFileSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';

/**
 * A private PostgreSQL cluster run from Debian's server binaries: used by `npm start`
 * (under the git-ignored data folder) and by the test setups (in a temp folder).
 * initdb refuses to run as root, so as root every server binary runs as the
 * unprivileged `postgres` system user.
 */
const run = promisify(execFile);
const PG_SYSTEM_USER = 'postgres';
export const POSTGRES_PACKAGE = 'postgresql';

export class PostgresSetupError extends Error {
  override name = 'PostgresSetupError';
}

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** The newest /usr/lib/postgresql/<version>/bin holding initdb and pg_ctl (or PG_BIN_DIR). */
export function findPostgresBinDir(): string | null {
  const override = process.env.PG_BIN_DIR;
  if (override) return existsSync(path.join(override, 'initdb')) ? override : null;
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return null;
  const versions = readdirSync(root)
    .filter((v) => existsSync(path.join(root, v, 'bin', 'initdb')) && existsSync(path.join(root, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number.parseFloat(b) - Number.parseFloat(a));
  return versions.length ? path.join(root, versions[0], 'bin') : null;
}

/**
 * A client tool (pg_dump, pg_restore) of one PostgreSQL major version, from Debian's
 * /usr/lib/postgresql/<major>/bin (or PG_BIN_DIR): a dump is best taken and restored by the
 * tools of the server's own version. Stops with a message naming the package when it is missing.
 */
export function findPostgresTool(name: 'pg_dump' | 'pg_restore', major: number): string {
  const dirs = [process.env.PG_BIN_DIR, `/usr/lib/postgresql/${major}/bin`].filter((d): d is string => Boolean(d));
  for (const dir of dirs) {
    const tool = path.join(dir, name);
    if (existsSync(tool)) return tool;
  }
  throw new PostgresSetupError(
    `${name} for PostgreSQL ${major} (the server's version) was not found in /usr/lib/postgresql/${major}/bin.\n` +
      `Install Debian's "postgresql-client-${major}" package (sudo apt-get install -y postgresql-client-${major}) and run the command again.`,
  );
}

/**
 * Finds the server binaries; when they are missing installs Debian's package as root,
 * otherwise stops with a message naming the package.
 */
export function ensurePostgresBinaries(log: (line: string) => void = console.log, options: { asRoot?: boolean } = {}): string {
  const found = findPostgresBinDir();
  if (found) return found;
  if (!(options.asRoot ?? isRoot())) {
    throw new PostgresSetupError(
      `PostgreSQL's server binaries were not found under /usr/lib/postgresql/*/bin.\n` +
        `Install Debian's "${POSTGRES_PACKAGE}" package (sudo apt-get install -y ${POSTGRES_PACKAGE}) and run the command again.`,
    );
  }
  log(`PostgreSQL server binaries not found: installing the "${POSTGRES_PACKAGE}" package with apt-get…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  try {
    execFileSync('apt-get', ['install', '-y', '--no-install-recommends', POSTGRES_PACKAGE], { stdio: 'inherit', env });
  } catch {
    execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
    execFileSync('apt-get', ['install', '-y', '--no-install-recommends', POSTGRES_PACKAGE], { stdio: 'inherit', env });
  }
  const installed = findPostgresBinDir();
  if (!installed) throw new PostgresSetupError(`Installed "${POSTGRES_PACKAGE}" but found no server binaries under /usr/lib/postgresql.`);
  return installed;
}

function ensureSystemUser(): { uid: number; gid: number } {
  const lookup = () => {
    try {
      const uid = Number(execFileSync('id', ['-u', PG_SYSTEM_USER], { encoding: 'utf8' }).trim());
      const gid = Number(execFileSync('id', ['-g', PG_SYSTEM_USER], { encoding: 'utf8' }).trim());
      return { uid, gid };
    } catch {
      return null;
    }
  };
  const existing = lookup();
  if (existing) return existing;
  execFileSync('useradd', ['--system', '--user-group', '--no-create-home', '--shell', '/usr/sbin/nologin', PG_SYSTEM_USER]);
  const created = lookup();
  if (!created) throw new PostgresSetupError(`Could not create the "${PG_SYSTEM_USER}" system user.`);
  return created;
}

/** Lets the cluster's user reach `dir`: every ancestor gets the search (x) bit for others. */
function makeAncestorsTraversable(dir: string): void {
  let current = path.dirname(path.resolve(dir));
  while (current !== path.dirname(current)) {
    const mode = statSync(current).mode;
    if ((mode & 0o001) === 0) chmodSync(current, (mode & 0o7777) | 0o001);
    current = path.dirname(current);
  }
}

export interface ClusterLayout {
  /** Folder owned by the cluster's user: holds pgdata/ and server.log. */
  root: string;
  port: number;
  /** Turns off durability (fsync etc.): only for throwaway test clusters. */
  throwaway?: boolean;
}

const pgdataOf = (layout: ClusterLayout) => path.join(layout.root, 'pgdata');
const logOf = (layout: ClusterLayout) => path.join(layout.root, 'server.log');

export class PostgresCluster {
  private readonly asRoot = isRoot();
  private owner: { uid: number; gid: number } | null = null;

  constructor(
    readonly binDir: string,
    readonly layout: ClusterLayout,
  ) {}

  private async tool(name: string, args: string[]): Promise<string> {
    const bin = path.join(this.binDir, name);
    const [cmd, fullArgs] = this.asRoot ? ['runuser', ['-u', PG_SYSTEM_USER, '--', bin, ...args]] : [bin, args];
    try {
      const { stdout } = await run(cmd, fullArgs, { encoding: 'utf8' });
      return stdout;
    } catch (error) {
      const e = error as { stderr?: string; stdout?: string; code?: number };
      const err = new PostgresSetupError(`${name} failed (exit ${e.code ?? '?'}): ${(e.stderr || e.stdout || String(error)).trim()}`);
      (err as PostgresSetupError & { exitCode?: number }).exitCode = e.code;
      throw err;
    }
  }

  get initialized(): boolean {
    return existsSync(path.join(pgdataOf(this.layout), 'PG_VERSION'));
  }

  private prepareFolder(): void {
    mkdirSync(this.layout.root, { recursive: true });
    if (this.asRoot) {
      this.owner ??= ensureSystemUser();
      makeAncestorsTraversable(this.layout.root);
      chownSync(this.layout.root, this.owner.uid, this.owner.gid);
    }
    chmodSync(this.layout.root, 0o700);
  }

  /** initdb with a superuser role `user`/`password` (scram on TCP). No-op when already initialized. */
  async init(user: string, password: string): Promise<boolean> {
    this.prepareFolder();
    if (this.initialized) return false;
    const pwfile = path.join(this.layout.root, '.pwfile');
    writeFileSync(pwfile, `${password}\n`, { mode: 0o600 });
    if (this.asRoot && this.owner) chownSync(pwfile, this.owner.uid, this.owner.gid);
    try {
      await this.tool('initdb', [
        '-D', pgdataOf(this.layout), '-U', user, `--pwfile=${pwfile}`,
        '--auth-local=trust', '--auth-host=scram-sha-256', '-E', 'UTF8', '--locale=C.UTF-8',
        ...(this.layout.throwaway ? ['--no-sync'] : []),
      ]);
    } finally {
      rmSync(pwfile, { force: true });
    }
    return true;
  }

  async isRunning(): Promise<boolean> {
    try {
      await this.tool('pg_ctl', ['-D', pgdataOf(this.layout), 'status']);
      return true;
    } catch (error) {
      const code = (error as { exitCode?: number }).exitCode;
      if (code === 3 || code === 4) return false;
      if (!this.initialized) return false;
      throw error;
    }
  }

  /** Starts the server on 127.0.0.1:port unless it is already running. */
  async start(): Promise<boolean> {
    if (await this.isRunning()) return false;
    const options = [
      '-c listen_addresses=127.0.0.1',
      `-p ${this.layout.port}`,
      `-c unix_socket_directories=${this.layout.root}`,
      ...(this.layout.throwaway ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
    ].join(' ');
    try {
      await this.tool('pg_ctl', ['-D', pgdataOf(this.layout), '-l', logOf(this.layout), '-w', '-t', '60', '-o', options, 'start']);
    } catch (error) {
      const tail = existsSync(logOf(this.layout)) ? readFileSync(logOf(this.layout), 'utf8').split('\n').slice(-15).join('\n') : '';
      throw new PostgresSetupError(`${(error as Error).message}\nLast lines of ${logOf(this.layout)}:\n${tail}`);
    }
    return true;
  }

  async stop(): Promise<void> {
    if (!this.initialized || !(await this.isRunning())) return;
    await this.tool('pg_ctl', ['-D', pgdataOf(this.layout), '-m', 'fast', '-w', 'stop']);
  }

  /** Creates `database` if missing, connecting as the cluster's superuser. */
  async ensureDatabase(connection: { user: string; password: string }, database: string): Promise<boolean> {
    const client = new pg.Client({ host: '127.0.0.1', port: this.layout.port, user: connection.user, password: connection.password, database: 'postgres' });
    await client.connect();
    try {
      const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
      if (rowCount) return false;
      await client.query(`CREATE DATABASE ${pg.escapeIdentifier(database)}`);
      return true;
    } finally {
      await client.end();
    }
  }
}

/** The parts of a postgres:// URL a local cluster needs. */
export function describeDatabaseUrl(url: string): { user: string; password: string; host: string; port: number; database: string } {
  const u = new URL(url);
  return {
    user: decodeURIComponent(u.username || 'postgres'),
    password: decodeURIComponent(u.password),
    host: u.hostname,
    port: Number(u.port || 5432),
    database: decodeURIComponent(u.pathname.replace(/^\//, '')) || 'postgres',
  };
}
