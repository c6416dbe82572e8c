import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import { ValidationError } from '@server/errors/index.ts';
import type { FieldProblem } from '@server/errors/index.ts';
import { dottedPath, fieldsOf } from '@server/middlewares/error-handler.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** Validates a request part with a shared zod schema; a failure names every bad field. */
export function validate<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw new ValidationError('Some fields are not valid', fieldsOf(result.error));
  const unstorable = unstorableText(result.data);
  if (unstorable.length > 0) throw new ValidationError('Some fields hold characters that cannot be stored', unstorable);
  return result.data;
}

/**
 * Text PostgreSQL cannot keep as written: the NUL character, and UTF-16 halves of a character
 * without their other half (they would be stored as U+FFFD). Checked in every string and key.
 */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export function unstorableText(value: unknown, path: PropertyKey[] = [], found: FieldProblem[] = []): FieldProblem[] {
  const problem = (s: string) => (s.includes('\u0000') ? 'contains a NUL character' : LONE_SURROGATE.test(s) ? 'contains half of a character (an unpaired surrogate)' : null);
  if (typeof value === 'string') {
    const message = problem(value);
    if (message) found.push({ path: dottedPath(path) || '(body)', message: `This text ${message}` });
  } else if (Array.isArray(value)) {
    value.forEach((item, i) => unstorableText(item, [...path, i], found));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) {
      const message = problem(key);
      if (message) found.push({ path: dottedPath([...path, key]), message: `This field name ${message}` });
      unstorableText(item, [...path, key], found);
    }
  }
  return found;
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
