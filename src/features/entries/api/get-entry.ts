import { queryOptions, useQuery } from '@tanstack/react-query';
import { entryDetailSchema } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';
import { entriesKey } from './get-entries.ts';

/** The entry, its head revision and the caller's own working draft (if any). */
export const getEntry = (notebookId: string, entryId: string) =>
  api.get(entriesApi.entry(notebookId, entryId), entryDetailSchema);

export const getEntryQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({
    queryKey: [...entriesKey(notebookId), 'detail', entryId],
    queryFn: () => getEntry(notebookId, entryId),
    // The editor holds the working copy; refetching under it would only confuse.
    staleTime: Infinity,
  });

export const useEntry = (notebookId: string, entryId: string) =>
  useQuery(getEntryQueryOptions(notebookId, entryId));
