import type { ValidateModelResponse } from '@shared/api/entries.ts';
import { validateModel as engineValidateModel } from '@server/engine/analyze.ts';

/**
 * Every problem with a model, for live checking in the model form: shape (names, lengths,
 * numbers), then expressions (syntax, known names, allowed functions), each with the field path
 * ("model.variables[1].rhs") and, for expressions, the character position. Parsing only.
 */
export function validateModel(model: unknown): ValidateModelResponse {
  return {
    errors: engineValidateModel(model).map((e) => ({
      path: e.path ?? 'model',
      message: e.message,
      ...(e.position !== undefined ? { position: e.position } : {}),
    })),
  };
}
