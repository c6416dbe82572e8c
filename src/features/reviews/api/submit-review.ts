import { useMutation, useQueryClient } from '@tanstack/react-query';
import { reviewDetailSchema, submitReviewSchema, type SubmitReviewInput } from '@shared/api/reviews.ts';
import { entriesKey } from '@/features/entries/api/get-entries.ts';
import { api } from '@/lib/api-client.ts';
import { reviewKey, reviewsApi } from './reviews-path.ts';

export { submitReviewSchema };

/** Ask the notebook's PIs to review the entry's head revision. */
export const submitReview = (notebookId: string, entryId: string, input: SubmitReviewInput) =>
  api.post(reviewsApi.review(notebookId, entryId), input, reviewDetailSchema);

export function useSubmitReview(notebookId: string, entryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SubmitReviewInput) => submitReview(notebookId, entryId, input),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: reviewKey(notebookId, entryId) });
      // The entry's status moves to "in review".
      await qc.invalidateQueries({ queryKey: entriesKey(notebookId) });
    },
  });
}
