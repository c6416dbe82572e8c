/** API paths of an entry's attachments, built in one place. */
const entry = (notebookId: string, entryId: string) => `/api/notebooks/${encodeURIComponent(notebookId)}/entries/${encodeURIComponent(entryId)}`;

export const attachmentsApi = {
  attachments: (notebookId: string, entryId: string) => `${entry(notebookId, entryId)}/attachments`,
  attachment: (notebookId: string, entryId: string, id: string) => `${entry(notebookId, entryId)}/attachments/${encodeURIComponent(id)}`,
};

export const attachmentsKey = (notebookId: string, entryId: string) => ['attachments', notebookId, entryId] as const;
