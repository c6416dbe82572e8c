import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class ConflictError extends HttpError {
  constructor(message = 'This conflicts with the current state', fields?: FieldProblem[]) {
    super(409, ERROR_CODES.conflict, message, fields);
  }
}
