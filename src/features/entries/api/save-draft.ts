import { useMutation } from '@tanstack/react-query';
import { draftSchema, type SaveDraftInput } from '@shared/api/entries.ts';
import { api } from '@/lib/api-client.ts';
import { entriesApi } from './entries-path.ts';

/** Autosave of the caller's working draft (per person, not a revision). */
export const saveDraft = (notebookId: string, entryId: string, input: SaveDraftInput) =>
  api.put(entriesApi.draft(notebookId, entryId), input, draftSchema);

/** Throw the working draft away. */
export const discardDraft = (notebookId: string, entryId: string) =>
  api.delete(entriesApi.draft(notebookId, entryId));

export function useSaveDraft(notebookId: string, entryId: string) {
  return useMutation({ mutationFn: (input: SaveDraftInput) => saveDraft(notebookId, entryId, input) });
}

export function useDiscardDraft(notebookId: string, entryId: string) {
  return useMutation({ mutationFn: () => discardDraft(notebookId, entryId) });
}
