import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client.ts';
import { getMembersQueryOptions } from './get-members.ts';

/** PI only; not the last PI. */
export const removeMember = (notebookId: string, userId: string) =>
  api.delete(`/api/notebooks/${encodeURIComponent(notebookId)}/members/${encodeURIComponent(userId)}`);

export function useRemoveMember(notebookId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => removeMember(notebookId, userId),
    onSuccess: () => qc.invalidateQueries({ queryKey: getMembersQueryOptions(notebookId).queryKey }),
  });
}
