import { HttpError } from '@server/errors/http.error.ts';

/** 422: the named cell has no output that can be drawn (not run, failed, or a kind without a plot). */
export class NotPlottableError extends HttpError {
  constructor(message: string, path = 'cellId') {
    super(422, 'not_plottable', message, [{ path, message }]);
  }
}
