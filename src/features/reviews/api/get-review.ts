import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewDetailSchema, type ReviewDetail } from '@shared/api/reviews.ts';
import { api } from '@/lib/api-client.ts';
import { isApiError } from '@/lib/api-error.ts';
import { reviewKey, reviewsApi } from './reviews-path.ts';

/** The entry's latest review (open or closed) with its signatures; null when it was never submitted. */
export async function getReview(notebookId: string, entryId: string): Promise<ReviewDetail | null> {
  try {
    return await api.get(reviewsApi.review(notebookId, entryId), reviewDetailSchema);
  } catch (e) {
    if (isApiError(e) && e.status === 404) return null;
    throw e;
  }
}

export const getReviewQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({ queryKey: [...reviewKey(notebookId, entryId), 'detail'], queryFn: () => getReview(notebookId, entryId) });

export const useReview = (notebookId: string, entryId: string) => useQuery(getReviewQueryOptions(notebookId, entryId));
