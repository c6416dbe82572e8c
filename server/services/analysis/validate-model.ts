import type { ValidateModelResponse } from '@shared/api/entries.ts';
import { problemsFromZod } from '@shared/cells/inputs.ts';
import { modelSchema } from '@shared/engine/contract.ts';
import { parseModel } from '@server/engine/model/parse.ts';

/**
 * Every problem with a model, for live checking in the model form: first its shape (names,
 * lengths, numbers), then the expressions (syntax, known names, allowed functions), each with
 * the field path ("model.variables[1].rhs") and, for expressions, the character position.
 * Parsing only; nothing is computed.
 */
export function validateModel(model: unknown): ValidateModelResponse {
  const shape = modelSchema.safeParse(model);
  if (!shape.success) return { errors: problemsFromZod(shape.error, 'model') };
  const { errors } = parseModel(shape.data, 'model');
  return {
    errors: errors.map((e) => ({ path: e.path ?? 'model', message: e.message, ...(e.position !== undefined ? { position: e.position } : {}) })),
  };
}
