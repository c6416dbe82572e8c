import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class MalformedJsonError extends HttpError {
  constructor(message = 'The request body is not valid JSON', fields?: FieldProblem[]) {
    super(400, ERROR_CODES.malformedJson, message, fields);
  }
}
