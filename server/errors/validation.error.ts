import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class ValidationError extends HttpError {
  constructor(message = 'Some fields are not valid', fields?: FieldProblem[]) {
    super(400, ERROR_CODES.validation, message, fields);
  }
}
