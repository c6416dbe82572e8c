import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { commentListSchema, commentSchema, createCommentSchema, type CreateCommentInput } from '@shared/api/reviews.ts';
import { api } from '@/lib/api-client.ts';
import { reviewKey, reviewsApi } from './reviews-path.ts';

export { createCommentSchema };

const commentsKey = (notebookId: string, entryId: string) => [...reviewKey(notebookId, entryId), 'comments'] as const;

/** Every comment thread of the entry (all revisions), with replies. */
export const getComments = (notebookId: string, entryId: string) => api.get(reviewsApi.comments(notebookId, entryId), commentListSchema);

export const getCommentsQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({ queryKey: commentsKey(notebookId, entryId), queryFn: () => getComments(notebookId, entryId) });

export const useComments = (notebookId: string, entryId: string) => useQuery(getCommentsQueryOptions(notebookId, entryId));

function useCommentMutation<I>(notebookId: string, entryId: string, send: (input: I) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: () => qc.invalidateQueries({ queryKey: getCommentsQueryOptions(notebookId, entryId).queryKey }),
  });
}

/** A new thread on a block or cell, or (with parentId) a reply. */
export const createComment = (notebookId: string, entryId: string, input: CreateCommentInput) =>
  api.post(reviewsApi.comments(notebookId, entryId), input, commentSchema);
export const useCreateComment = (notebookId: string, entryId: string) =>
  useCommentMutation(notebookId, entryId, (input: CreateCommentInput) => createComment(notebookId, entryId, input));

/** Resolve or reopen a thread. */
export const setThreadResolved = (notebookId: string, entryId: string, commentId: string, resolved: boolean) =>
  api.post(
    resolved ? reviewsApi.resolveComment(notebookId, entryId, commentId) : reviewsApi.reopenComment(notebookId, entryId, commentId),
    undefined,
    commentSchema,
  );
export const useSetThreadResolved = (notebookId: string, entryId: string) =>
  useCommentMutation(notebookId, entryId, ({ commentId, resolved }: { commentId: string; resolved: boolean }) =>
    setThreadResolved(notebookId, entryId, commentId, resolved),
  );
