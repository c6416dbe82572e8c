import { queryOptions, useQuery } from '@tanstack/react-query';
import { revisionSchema } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';
import { getRevisionsQueryOptions } from './get-revisions.ts';

/** One revision in full (revisions never change, so it is cached for good). */
export const getRevision = (notebookId: string, entryId: string, revisionId: string) =>
  api.get(entriesApi.revision(notebookId, entryId, revisionId), revisionSchema);

export const getRevisionQueryOptions = (notebookId: string, entryId: string, revisionId: string) =>
  queryOptions({
    queryKey: [...getRevisionsQueryOptions(notebookId, entryId).queryKey, revisionId],
    queryFn: () => getRevision(notebookId, entryId, revisionId),
    staleTime: Infinity,
  });

export const useRevision = (notebookId: string, entryId: string, revisionId: string | null) =>
  useQuery({
    ...getRevisionQueryOptions(notebookId, entryId, revisionId ?? ''),
    enabled: revisionId !== null,
  });
