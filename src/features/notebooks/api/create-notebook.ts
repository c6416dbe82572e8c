import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createNotebookSchema, notebookSchema, type CreateNotebookInput } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';
import { getNotebooksQueryOptions } from './get-notebooks.ts';

export { createNotebookSchema };

/** The creator becomes the notebook's PI. */
export const createNotebook = (input: CreateNotebookInput) =>
  api.post('/api/notebooks', input, notebookSchema);

export function useCreateNotebook() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createNotebook,
    onSuccess: () => qc.invalidateQueries({ queryKey: getNotebooksQueryOptions().queryKey }),
  });
}
