import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError, type FieldProblem } from './http.error.ts';

export class PayloadTooLargeError extends HttpError {
  constructor(message = 'The request body is too large', fields?: FieldProblem[]) {
    super(413, ERROR_CODES.payloadTooLarge, message, fields);
  }
}
