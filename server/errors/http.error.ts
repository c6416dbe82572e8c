import type { ApiError } from '@shared/api/errors.ts';

export type FieldProblem = { path: string; message: string };

/** Base of every error the API reports on purpose: an HTTP status and a stable code. */
export abstract class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldProblem[],
  ) {
    super(message);
    this.name = new.target.name;
  }

  toBody(): ApiError {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }
}
