import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class RateLimitedError extends HttpError {
  constructor(message = 'Too many attempts: wait a few minutes and try again', fields?: FieldProblem[]) {
    super(429, ERROR_CODES.rateLimited, message, fields);
  }
}
