import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createEntrySchema, entryDetailSchema, type CreateEntryInput } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';
import { entriesKey } from './get-entries.ts';

export { createEntrySchema };

/** Creates the entry with an empty revision #1. */
export const createEntry = (notebookId: string, input: CreateEntryInput) =>
  api.post(entriesApi.entries(notebookId), input, entryDetailSchema);

export function useCreateEntry(notebookId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateEntryInput) => createEntry(notebookId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: entriesKey(notebookId) }),
  });
}
