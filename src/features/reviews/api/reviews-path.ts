/** API paths of reviews and comments, built in one place. */
const entry = (notebookId: string, entryId: string) =>
  `/api/notebooks/${encodeURIComponent(notebookId)}/entries/${encodeURIComponent(entryId)}`;

export const reviewsApi = {
  review: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/review`,
  markSeen: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/review/mark-seen`,
  requestChanges: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/review/request-changes`,
  approve: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/review/approve`,
  reproducibility: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/review/reproducibility`,
  queue: () => '/api/reviews/queue',
  comments: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/comments`,
  resolveComment: (notebookId: string, entryId: string, commentId: string) =>
    `${entry(notebookId, entryId)}/comments/${encodeURIComponent(commentId)}/resolve`,
  reopenComment: (notebookId: string, entryId: string, commentId: string) =>
    `${entry(notebookId, entryId)}/comments/${encodeURIComponent(commentId)}/reopen`,
};

/** Root of every review query of one entry (mutations invalidate by it). */
export const reviewKey = (notebookId: string, entryId: string) => ['reviews', notebookId, entryId] as const;
