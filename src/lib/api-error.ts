import { apiErrorSchema } from '@shared/api/errors.ts';

export type FieldIssue = { path: string; message: string };

/** An error the API answered with (or a network failure, status 0), with its stable code. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldIssue[] = [],
  ) {
    super(message);
  }

  /** The message for one field, by its dotted path. */
  fieldMessage(path: string): string | undefined {
    return this.fields.find((f) => f.path === path)?.message;
  }
}

/** Reads an error response body into an ApiError; falls back to the status when the body isn't ours. */
export function toApiError(status: number, body: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(status, code, message, fields ?? []);
  }
  const fallback: Record<number, [string, string]> = {
    400: ['validation_failed', 'The request was not accepted.'],
    401: ['unauthenticated', 'Please sign in.'],
    403: ['forbidden', 'You do not have permission to do that.'],
    404: ['not_found', 'Not found.'],
    409: ['conflict', 'Someone else changed this first. Reload and try again.'],
    413: ['payload_too_large', 'That is too large to send.'],
    429: ['rate_limited', 'Too many attempts. Wait a minute and try again.'],
  };
  const [code, message] = fallback[status] ?? [
    'internal_error',
    `The server answered with an error (${status}).`,
  ];
  return new ApiError(status, code, message);
}

export function isApiError(e: unknown, code?: string): e is ApiError {
  return e instanceof ApiError && (code === undefined || e.code === code);
}
