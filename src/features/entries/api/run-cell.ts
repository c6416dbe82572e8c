import { runCellResponseSchema, type RunCellResponse } from '@shared/api/entries.ts';
import type { ResolvedRequest } from '@shared/cells/resolve.ts';
import { apiRequest } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';

/**
 * Run a cell on the server with its resolved request. Aborting `signal` cancels the request, and
 * the server cancels the run. Engine errors come back as an output with status "error".
 * (Not a TanStack mutation: the cell runner tracks many concurrent runs and their cancellation.)
 */
export const runCell = (
  notebookId: string,
  entryId: string,
  cellId: string,
  request: ResolvedRequest,
  signal?: AbortSignal,
): Promise<RunCellResponse> =>
  apiRequest(entriesApi.cellRun(notebookId, entryId, cellId), {
    method: 'POST',
    body: request,
    schema: runCellResponseSchema,
    signal,
  });
