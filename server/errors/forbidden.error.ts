import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class ForbiddenError extends HttpError {
  constructor(message = 'Your role does not allow this', fields?: FieldProblem[]) {
    super(403, ERROR_CODES.forbidden, message, fields);
  }
}
