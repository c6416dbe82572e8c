/** Download addresses of an entry's exports (plain links: the browser downloads them with the session cookie). */
const entry = (notebookId: string, entryId: string) => `/api/notebooks/${encodeURIComponent(notebookId)}/entries/${encodeURIComponent(entryId)}/export`;
const rev = (revisionId?: string, first = '?') => (revisionId ? `${first}revisionId=${encodeURIComponent(revisionId)}` : '');

export const exportsApi = {
  cell: (notebookId: string, entryId: string, cellId: string, format: 'csv' | 'json', revisionId?: string) =>
    `${entry(notebookId, entryId)}/cells/${encodeURIComponent(cellId)}?format=${format}${rev(revisionId, '&')}`,
  record: (notebookId: string, entryId: string, revisionId?: string) => `${entry(notebookId, entryId)}/record${rev(revisionId)}`,
  archive: (notebookId: string, entryId: string, revisionId?: string) => `${entry(notebookId, entryId)}/archive${rev(revisionId)}`,
};
