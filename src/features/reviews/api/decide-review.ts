import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  approveReviewSchema,
  markSeenSchema,
  requestChangesSchema,
  reviewDetailSchema,
  type ApproveReviewInput,
  type MarkSeenInput,
  type RequestChangesInput,
} from '@shared/api/reviews.ts';
import { entriesKey } from '@/features/entries/api/get-entries.ts';
import { api, apiRequest } from '@/lib/api-client.ts';
import { reviewKey, reviewsApi } from './reviews-path.ts';
import { reviewQueueKey } from './get-review-queue.ts';

export { approveReviewSchema, requestChangesSchema };

/**
 * The PI's three review endpoints (mark seen, request changes, approve with signature): they
 * share one invalidation — the review, its comments, the entry list and the PI's queue.
 */
function useReviewMutation<I>(notebookId: string, entryId: string, send: (input: I) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: async () => {
      await Promise.all([
        qc.invalidateQueries({ queryKey: reviewKey(notebookId, entryId) }),
        qc.invalidateQueries({ queryKey: entriesKey(notebookId) }),
        qc.invalidateQueries({ queryKey: reviewQueueKey }),
      ]);
    },
  });
}

/** Record that the PI has looked at a revision ("what changed since you last looked" starts there). */
export const markSeen = (notebookId: string, entryId: string, input: MarkSeenInput) =>
  api.post(reviewsApi.markSeen(notebookId, entryId), markSeenSchema.parse(input), reviewDetailSchema);
export const useMarkSeen = (notebookId: string, entryId: string) =>
  useReviewMutation(notebookId, entryId, (input: MarkSeenInput) => markSeen(notebookId, entryId, input));

/** Send the entry back to its author with a comment. */
export const requestChanges = (notebookId: string, entryId: string, input: RequestChangesInput) =>
  api.post(reviewsApi.requestChanges(notebookId, entryId), input, reviewDetailSchema);
export const useRequestChanges = (notebookId: string, entryId: string) =>
  useReviewMutation(notebookId, entryId, (input: RequestChangesInput) => requestChanges(notebookId, entryId, input));

/**
 * Approve with an electronic signature: the PI's password typed again. 401 "signature_failed"
 * means the password was wrong; 409 that a newer revision is now under review.
 */
export const approveReview = (notebookId: string, entryId: string, input: ApproveReviewInput) =>
  // A wrong password answers 401: shown in the dialog, not taken as the end of the session.
  apiRequest(reviewsApi.approve(notebookId, entryId), { method: 'POST', body: input, schema: reviewDetailSchema, on401: 'return' });
export const useApproveReview = (notebookId: string, entryId: string) =>
  useReviewMutation(notebookId, entryId, (input: ApproveReviewInput) => approveReview(notebookId, entryId, input));
