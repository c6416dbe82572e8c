import { randomUUID } from 'node:crypto';

/** Object keys are built from ids only: nothing a person typed ends up in a key. */
export function attachmentKey(notebookId: string, entryId: string, id: string = randomUUID()): string {
  return `notebooks/${notebookId}/entries/${entryId}/attachments/${id}`;
}

export function figureKey(notebookId: string, entryId: string, figureId: string, ext: 'svg' | 'png'): string {
  return `notebooks/${notebookId}/entries/${entryId}/figures/${figureId}.${ext}`;
}
