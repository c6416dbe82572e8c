import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { notebookSchema, updateNotebookSchema } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';
import { getNotebooksQueryOptions } from './get-notebooks.ts';

export { updateNotebookSchema };

/** PI only. */
export const updateNotebook = ({ id, ...input }: z.output<typeof updateNotebookSchema> & { id: string }) =>
  api.patch(`/api/notebooks/${encodeURIComponent(id)}`, input, notebookSchema);

export function useUpdateNotebook() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateNotebook,
    // The list key is a prefix of each notebook's key, so both refresh.
    onSuccess: () => qc.invalidateQueries({ queryKey: getNotebooksQueryOptions().queryKey }),
  });
}
