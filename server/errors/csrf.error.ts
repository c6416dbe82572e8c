import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class CsrfError extends HttpError {
  constructor(message = 'The security token is missing or out of date: reload the page and try again', fields?: FieldProblem[]) {
    super(403, ERROR_CODES.csrf, message, fields);
  }
}
