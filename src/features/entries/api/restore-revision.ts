import { useMutation, useQueryClient } from '@tanstack/react-query';
import { revisionSchema } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';
import { entriesKey } from './get-entries.ts';

/** Record an old revision's content again, as a new revision on top of `baseRevisionId` (the head). */
export const restoreRevision = (
  notebookId: string,
  entryId: string,
  revisionId: string,
  baseRevisionId: string,
) =>
  api.post(
    `${entriesApi.revision(notebookId, entryId, revisionId)}/restore`,
    { baseRevisionId },
    revisionSchema,
  );

export function useRestoreRevision(notebookId: string, entryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ revisionId, baseRevisionId }: { revisionId: string; baseRevisionId: string }) =>
      restoreRevision(notebookId, entryId, revisionId, baseRevisionId),
    onSuccess: () => qc.invalidateQueries({ queryKey: entriesKey(notebookId) }),
  });
}
