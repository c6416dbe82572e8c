import { queryOptions, useQuery } from '@tanstack/react-query';
import { revisionListSchema } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';
import { entriesKey } from './get-entries.ts';

/** Every revision of the entry, newest first. */
export const getRevisions = (notebookId: string, entryId: string) =>
  api.get(entriesApi.revisions(notebookId, entryId), revisionListSchema);

export const getRevisionsQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({
    queryKey: [...entriesKey(notebookId), 'revisions', entryId],
    queryFn: () => getRevisions(notebookId, entryId),
  });

export const useRevisions = (notebookId: string, entryId: string, enabled = true) =>
  useQuery({ ...getRevisionsQueryOptions(notebookId, entryId), enabled });
