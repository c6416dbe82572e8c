import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class UnauthenticatedError extends HttpError {
  constructor(message = 'Sign in first', fields?: FieldProblem[]) {
    super(401, ERROR_CODES.unauthenticated, message, fields);
  }
}
