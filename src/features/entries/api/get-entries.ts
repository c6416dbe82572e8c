import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { entryListSchema, type ListEntriesQuery } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';

/** The notebook's entries, newest first, filtered on the server. */
export function getEntries(notebookId: string, filters: ListEntriesQuery = {}) {
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v) qs.set(k, String(v));
  const query = qs.toString();
  return api.get(`${entriesApi.entries(notebookId)}${query ? `?${query}` : ''}`, entryListSchema);
}

/** Key prefix of everything cached about one notebook's entries. */
export const entriesKey = (notebookId: string) => ['entries', notebookId] as const;

export const getEntriesQueryOptions = (notebookId: string, filters: ListEntriesQuery = {}) =>
  queryOptions({
    queryKey: [...entriesKey(notebookId), 'list', filters],
    queryFn: () => getEntries(notebookId, filters),
    placeholderData: keepPreviousData,
  });

export const useEntries = (notebookId: string, filters: ListEntriesQuery = {}) =>
  useQuery(getEntriesQueryOptions(notebookId, filters));
