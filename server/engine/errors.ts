import type { EngineErrorCode, EngineFieldError } from '@shared/engine/contract.ts';

/**
 * A bad request: the model or task cannot be used as given. Carries a stable `code`, a message
 * for people, the field `path` (e.g. "model.variables[1].rhs") and the 0-based character
 * `position` inside that field's text where they apply.
 */
export class EngineRequestError extends Error {
  readonly code: EngineErrorCode;
  readonly path?: string;
  readonly position?: number;
  /** Every problem found (the first one is also in code/message/path/position). */
  readonly fields: EngineFieldError[];

  constructor(first: EngineFieldError & { code: EngineErrorCode }, fields: EngineFieldError[] = [first]) {
    super(first.message);
    this.name = 'EngineRequestError';
    this.code = first.code;
    this.path = first.path;
    this.position = first.position;
    this.fields = fields;
  }

  toJSON(): { error: EngineFieldError } {
    const error: EngineFieldError = { code: this.code, message: this.message };
    if (this.path !== undefined) error.path = this.path;
    if (this.position !== undefined) error.position = this.position;
    return { error };
  }
}

/** A misuse of an engine function by calling code (wrong sizes, a bug): not the user's fault. */
export class EngineUsageError extends Error {
  readonly data: Record<string, unknown>;
  constructor(message: string, data: Record<string, unknown> = {}) {
    super(message);
    this.name = 'EngineUsageError';
    this.data = data;
  }
}
