import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewQueueSchema } from '@shared/api/reviews.ts';
import { api } from '@/lib/api-client.ts';
import { reviewsApi } from './reviews-path.ts';

export const reviewQueueKey = ['reviews', 'queue'] as const;

/** Open reviews awaiting the caller as PI, across notebooks, oldest first. */
export const getReviewQueue = () => api.get(reviewsApi.queue(), reviewQueueSchema);

export const getReviewQueueQueryOptions = () => queryOptions({ queryKey: reviewQueueKey, queryFn: getReviewQueue });

export const useReviewQueue = () => useQuery(getReviewQueueQueryOptions());
