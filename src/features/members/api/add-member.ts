import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { addMemberSchema, memberSchema } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';
import { getMembersQueryOptions } from './get-members.ts';

export { addMemberSchema };

/** PI only; the person must already have an account. */
export const addMember = ({
  notebookId,
  ...input
}: z.output<typeof addMemberSchema> & { notebookId: string }) =>
  api.post(`/api/notebooks/${encodeURIComponent(notebookId)}/members`, input, memberSchema);

export function useAddMember(notebookId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof addMemberSchema>) => addMember({ notebookId, ...input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: getMembersQueryOptions(notebookId).queryKey }),
  });
}
