import type { Request } from 'express';
import type passport from 'passport';
import type { DataSource } from 'typeorm';
import type { RunQueue } from './analysis/run-queue.ts';
import type { Env } from './env.ts';
import type { Mailer } from './mail/mailer.ts';
import type { RateLimits } from './middlewares/rate-limits.ts';
import type { FileStorage } from './storage/file-storage.ts';

/** What the app is built from; tests pass their own. */
export interface AppDeps {
  env: Env;
  dataSource: DataSource;
  mailer: Mailer;
  storage: FileStorage;
  /** The cell-run queue shared by every instance, and this instance's workers and listener. */
  runQueue: RunQueue;
}

/** What every router factory receives: the deps plus the app's own request machinery. */
export interface RouteDeps extends AppDeps {
  passport: passport.PassportStatic;
  rateLimits: RateLimits;
  generateCsrfToken: (req: Request, overwrite?: boolean) => string;
}
