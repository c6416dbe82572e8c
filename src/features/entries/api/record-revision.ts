import { useMutation, useQueryClient } from '@tanstack/react-query';
import { revisionSchema, type RecordRevisionInput, type Revision } from '@shared/api/entries.ts';
import { ERROR_CODES } from '@shared/api/errors.ts';
import { api } from '@/lib/api-client.ts';
import { isApiError } from '@/lib/api-error.ts';
import { entriesApi } from './entries-path.ts';
import { entriesKey } from './get-entries.ts';
import { getEntry } from './get-entry.ts';

/** Someone recorded a revision after the one this edit started from. `current` is the head now. */
export class RevisionConflict extends Error {
  override readonly name = 'RevisionConflict';
  constructor(
    message: string,
    readonly current: Revision,
  ) {
    super(message);
  }
}

/**
 * Record the working copy as a new revision. On 409 (the base is no longer the head) this
 * throws a RevisionConflict carrying the current head, fetched fresh, so the author can see
 * what changed meanwhile and rebase.
 */
export async function recordRevision(
  notebookId: string,
  entryId: string,
  input: RecordRevisionInput,
): Promise<Revision> {
  try {
    return await api.post(entriesApi.revisions(notebookId, entryId), input, revisionSchema);
  } catch (e) {
    if (isApiError(e, ERROR_CODES.conflict)) {
      const detail = await getEntry(notebookId, entryId);
      throw new RevisionConflict(e.message, detail.head);
    }
    throw e;
  }
}

export function useRecordRevision(notebookId: string, entryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: RecordRevisionInput) => recordRevision(notebookId, entryId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: entriesKey(notebookId) }),
  });
}
