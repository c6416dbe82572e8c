import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class NotFoundError extends HttpError {
  constructor(message = 'Not found', fields?: FieldProblem[]) {
    super(404, ERROR_CODES.notFound, message, fields);
  }
}
