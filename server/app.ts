import { existsSync } from 'node:fs';
import path from 'node:path';
import connectPgSimple from 'connect-pg-simple';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import pg from 'pg';
import { LIMITS } from '@shared/domain/limits.ts';
import type { AppDeps, RouteDeps } from './app-deps.ts';
import { createPassport } from './middlewares/authenticate.ts';
import { DATABASE_CONNECT_TIMEOUT_MS } from './data-source.ts';
import { createCsrf } from './middlewares/csrf.ts';
import { apiNotFound, errorHandler } from './middlewares/error-handler.ts';
import { DEFAULT_RATE_LIMITS, createRateLimits, type RateLimitSettings } from './middlewares/rate-limits.ts';
import { API_ROUTES } from './routes/index.ts';
import { NotFoundError } from './errors/index.ts';

export const SESSION_COOKIE = 'bifolio.sid';
const SESSION_MAX_AGE_MS = 12 * 3600_000;

export interface AppOptions {
  /** Built client to serve with the SPA fallback (dist/client); omitted: API only. */
  clientDir?: string | null;
  rateLimits?: Partial<RateLimitSettings>;
  /** How often expired sessions are pruned, in seconds; false disables (tests). */
  sessionPruneSeconds?: number | false;
}

export interface BifolioApp {
  app: Express;
  /** Releases what the app holds (the session store's pool). */
  close(): Promise<void>;
}

/** Builds the Express app: security headers, JSON bodies, sessions in PostgreSQL, CSRF, passport, /api routes, the client. */
export function createApp(deps: AppDeps, options: AppOptions = {}): BifolioApp {
  const { env } = deps;
  const app = express();
  const secureCookies = env.PUBLIC_URL.startsWith('https:');
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  const storageOrigin = env.S3_ENDPOINT ? new URL(env.S3_ENDPOINT).origin : null;
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'script-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:', ...(storageOrigin ? [storageOrigin] : [])],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': secureCookies ? [] : null,
        },
      },
      strictTransportSecurity: secureCookies,
    }),
  );

  const sessionPool = new pg.Pool({ connectionString: env.DATABASE_URL, max: 4, connectionTimeoutMillis: DATABASE_CONNECT_TIMEOUT_MS });
  sessionPool.on('error', (error) => console.error(`[session-store] ${error.message}`));
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool: sessionPool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: options.sessionPruneSeconds ?? 15 * 60,
  });

  const api = express.Router();
  api.use(express.json({ limit: LIMITS.jsonBodyBytes }));
  api.use(
    session({
      name: SESSION_COOKIE,
      secret: env.SESSION_SECRET,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: secureCookies, maxAge: SESSION_MAX_AGE_MS, path: '/' },
    }),
  );
  const passportInstance = createPassport(deps.dataSource);
  api.use(passportInstance.session());
  const csrf = createCsrf();
  api.use(csrf.protect);

  const routeDeps: RouteDeps = {
    ...deps,
    passport: passportInstance,
    rateLimits: createRateLimits(deps.dataSource, { ...DEFAULT_RATE_LIMITS, signInFailures: env.SIGN_IN_FAILURE_LIMIT, ...options.rateLimits }),
    generateCsrfToken: csrf.generateToken,
  };
  for (const route of API_ROUTES) {
    if (route.devOnly && env.NODE_ENV === 'production') continue;
    api.use(route.path, route.create(routeDeps));
  }
  api.use(apiNotFound);
  app.use('/api', api);

  const clientDir = options.clientDir;
  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use('/assets', express.static(path.join(clientDir, 'assets'), { immutable: true, maxAge: '1y' }));
    app.use('/assets', (_req, _res, next) => next(new NotFoundError('No such file')));
    app.use(express.static(clientDir, { index: false }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }
  app.use(errorHandler);

  return {
    app,
    async close() {
      store.close();
      await sessionPool.end().catch(() => undefined);
    },
  };
}
