import { validateModelResponseSchema, type ValidateModelResponse } from '@shared/api/entries.ts';
import type { Model } from '@shared/engine/contract.ts';
import { apiRequest } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';

/** The engine's parser checks a model: each problem with its field path ("model.variables[1].rhs") and position. */
export const validateModel = (model: Model, signal?: AbortSignal): Promise<ValidateModelResponse> =>
  apiRequest(entriesApi.validateModel(), {
    method: 'POST',
    body: { model },
    schema: validateModelResponseSchema,
    signal,
  });
