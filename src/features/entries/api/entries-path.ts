/** API paths of the research log, built in one place. */
const nb = (notebookId: string) => `/api/notebooks/${encodeURIComponent(notebookId)}`;

export const entriesApi = {
  entries: (notebookId: string) => `${nb(notebookId)}/entries`,
  entry: (notebookId: string, entryId: string) => `${nb(notebookId)}/entries/${encodeURIComponent(entryId)}`,
  draft: (notebookId: string, entryId: string) => `${entriesApi.entry(notebookId, entryId)}/draft`,
  revisions: (notebookId: string, entryId: string) => `${entriesApi.entry(notebookId, entryId)}/revisions`,
  revision: (notebookId: string, entryId: string, revisionId: string) =>
    `${entriesApi.revisions(notebookId, entryId)}/${encodeURIComponent(revisionId)}`,
  cellRun: (notebookId: string, entryId: string, cellId: string) =>
    `${entriesApi.entry(notebookId, entryId)}/cells/${encodeURIComponent(cellId)}/run`,
  validateModel: () => '/api/engine/validate-model',
};
