import type { Router } from 'express';
import type { RouteDeps } from '@server/app-deps.ts';
import { authRoutes } from './auth.routes.ts';
import { engineRoutes } from './engine.routes.ts';
import { entriesRoutes } from './entries.routes.ts';
import { healthRoutes } from './health.routes.ts';
import { invitesRoutes } from './invites.routes.ts';
import { notebooksRoutes } from './notebooks.routes.ts';
import { outboxRoutes } from './outbox.routes.ts';
import { accountRoutes, usersRoutes } from './users.routes.ts';
import { auditRoutes } from './audit.routes.ts';
import { commentsRoutes } from './comments.routes.ts';
import { notificationsRoutes } from './notifications.routes.ts';
import { reviewQueueRoutes, reviewsRoutes } from './reviews.routes.ts';
import { attachmentsRoutes } from './attachments.routes.ts';
import { figuresRoutes } from './figures.routes.ts';
import { exportsRoutes } from './exports.routes.ts';
import { searchRoutes } from './search.routes.ts';
import { measurementsRoutes } from './measurements.routes.ts';

export interface RouteRegistration {
  /** Mount path under /api. */
  path: string;
  create: (deps: RouteDeps) => Router;
  /** Mounted only outside production. */
  devOnly?: boolean;
}

/** Every API router. Register a new one with one line here. */
export const API_ROUTES: RouteRegistration[] = [
  { path: '/health', create: healthRoutes },
  { path: '/auth', create: authRoutes },
  { path: '/invites', create: invitesRoutes },
  { path: '/users', create: usersRoutes },
  { path: '/account', create: accountRoutes },
  { path: '/notebooks', create: notebooksRoutes },
  { path: '/notebooks/:notebookId', create: entriesRoutes },
  { path: '/engine', create: engineRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/review', create: reviewsRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/comments', create: commentsRoutes },
  { path: '/reviews', create: reviewQueueRoutes },
  { path: '/audit', create: auditRoutes },
  { path: '/account/notifications', create: notificationsRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/attachments', create: attachmentsRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/figures', create: figuresRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/measurements', create: measurementsRoutes },
  { path: '/notebooks/:notebookId/entries/:entryId/export', create: exportsRoutes },
  { path: '/search', create: searchRoutes },
  { path: '/dev/outbox', create: outboxRoutes, devOnly: true },
];
