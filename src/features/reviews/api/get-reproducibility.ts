import { queryOptions, useQuery } from '@tanstack/react-query';
import { reproducibilityReportSchema } from '@shared/api/reviews.ts';
import { api } from '@/lib/api-client.ts';
import { reviewKey, reviewsApi } from './reviews-path.ts';

/** Rerun every cell of the revision under review now and compare with what is stored (no signing). */
export const getReproducibility = (notebookId: string, entryId: string) =>
  api.get(reviewsApi.reproducibility(notebookId, entryId), reproducibilityReportSchema);

export const getReproducibilityQueryOptions = (notebookId: string, entryId: string, revisionId: string) =>
  queryOptions({
    queryKey: [...reviewKey(notebookId, entryId), 'reproducibility', revisionId],
    queryFn: () => getReproducibility(notebookId, entryId),
    // A rerun is expensive: once per revision and dialog opening is enough.
    staleTime: 60_000,
  });

export const useReproducibility = (notebookId: string, entryId: string, revisionId: string, enabled: boolean) =>
  useQuery({ ...getReproducibilityQueryOptions(notebookId, entryId, revisionId), enabled });
