import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import { ValidationError } from '@server/errors/index.ts';
import { fieldsOf } from '@server/middlewares/error-handler.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** Validates a request part with a shared zod schema; a failure names every bad field. */
export function validate<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw new ValidationError('Some fields are not valid', fieldsOf(result.error));
  return result.data;
}

/** Runs `work` in one transaction with the caller as actor. */
export function inTransaction<T>(dataSource: DataSource, req: Request, work: (ctx: ServiceContext) => Promise<T>): Promise<T> {
  return dataSource.transaction((manager) => work({ actor: req.user ?? null, manager, ip: req.ip }));
}

/** Same, for routes behind requireUser: the actor is known. */
export function asUser<T>(
  dataSource: DataSource,
  req: Request,
  work: (ctx: ServiceContext & { actor: NonNullable<Request['user']> }) => Promise<T>,
): Promise<T> {
  const actor = req.user;
  if (!actor) throw new Error('asUser used on a route without requireUser');
  return dataSource.transaction((manager) => work({ actor, manager, ip: req.ip }));
}
