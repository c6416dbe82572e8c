import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { searchResponseSchema, type SearchQueryInput } from '@shared/api/search.ts';
import { api } from '@/lib/api-client.ts';

/** The query string of a search: empty fields left out. */
export function searchParams(query: SearchQueryInput): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== '' && v !== null) params.set(k, String(v));
  return params.toString();
}

export const searchEntriesQueryOptions = (query: SearchQueryInput) =>
  queryOptions({ queryKey: ['search', query], queryFn: () => api.get(`/api/search?${searchParams(query)}`, searchResponseSchema), placeholderData: keepPreviousData });

export const useSearchEntries = (query: SearchQueryInput, enabled = true) => useQuery({ ...searchEntriesQueryOptions(query), enabled });
