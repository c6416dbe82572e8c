import { z } from 'zod';

/**
 * Every API error has this shape. `code` is stable (clients branch on it); `message` is
 * for people; `fields` names each invalid field by its dotted path (e.g. "members[0].email").
 */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z
      .array(z.object({ path: z.string(), message: z.string() }))
      .optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

export const ERROR_CODES = {
  validation: 'validation_failed',
  malformedJson: 'malformed_json',
  payloadTooLarge: 'payload_too_large',
  unauthenticated: 'unauthenticated',
  forbidden: 'forbidden',
  notFound: 'not_found',
  conflict: 'conflict',
  csrf: 'csrf_invalid',
  rateLimited: 'rate_limited',
  databaseUnavailable: 'database_unavailable',
  internal: 'internal_error',
} as const;
