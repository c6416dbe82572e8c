import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const SOURCES = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json'];

function newestMtime(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return readdirSync(target).reduce((max, name) => Math.max(max, newestMtime(path.join(target, name))), stat.mtimeMs);
}

/** Builds the client into `outDir` when it is missing or older than its sources. */
export function buildClientIfStale(root: string, outDir: string, log: (line: string) => void): void {
  const built = path.join(outDir, 'index.html');
  const builtAt = existsSync(built) ? statSync(built).mtimeMs : 0;
  const sourcesAt = Math.max(...SOURCES.map((s) => newestMtime(path.join(root, s))));
  if (builtAt > sourcesAt) {
    log('Client: build is up to date.');
    return;
  }
  log('Client: building with Vite…');
  execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
  });
}
