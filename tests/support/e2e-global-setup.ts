import { execFileSync } from 'node:child_process';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startServer } from '@server/index.ts';
import { startThrowawayStack } from './throwaway-stack.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    outboxDir: string;
  }
}

/**
 * Browser tests: a throwaway cluster, S3 fake and SMTP sink on free ports, migrations and
 * the demo seed, a fresh client build, and the real server serving it on one origin.
 */
export default async function setup(project: TestProject) {
  const root = path.resolve(fileDir(), '../..');
  const stack = await startThrowawayStack({ database: 'bifolio_e2e' });
  try {
    const clientDir = path.join(stack.tmp, 'client');
    execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', clientDir, '--emptyOutDir', '--logLevel', 'error'], { cwd: root, stdio: 'inherit' });

    const server = await startServer(stack.env, { clientDir, sessionPruneSeconds: false });
    stack.onStop(server.stop);
    project.provide('baseUrl', stack.env.PUBLIC_URL);
    project.provide('outboxDir', stack.env.OUTBOX_DIR);
  } catch (error) {
    await stack.stop();
    throw error;
  }
  return stack.stop;
}

function fileDir(): string {
  return path.dirname(new URL(import.meta.url).pathname);
}
