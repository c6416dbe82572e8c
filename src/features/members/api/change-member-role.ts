import { useMutation, useQueryClient } from '@tanstack/react-query';
import { memberSchema } from '@shared/api/notebooks.ts';
import type { NotebookRole } from '@shared/domain/roles.ts';
import { api } from '@/lib/api-client.ts';
import { getMembersQueryOptions } from './get-members.ts';

/** PI only; the last PI can't be demoted (409). */
export const changeMemberRole = (notebookId: string, userId: string, role: NotebookRole) =>
  api.patch(
    `/api/notebooks/${encodeURIComponent(notebookId)}/members/${encodeURIComponent(userId)}`,
    { role },
    memberSchema,
  );

export function useChangeMemberRole(notebookId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: NotebookRole }) =>
      changeMemberRole(notebookId, userId, role),
    onSettled: () => qc.invalidateQueries({ queryKey: getMembersQueryOptions(notebookId).queryKey }),
  });
}
