import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client.ts';
import { attachmentsApi } from './attachments-path.ts';
import { getAttachmentsQueryOptions } from './get-attachments.ts';

export const removeAttachment = (notebookId: string, entryId: string, id: string) => api.delete(attachmentsApi.attachment(notebookId, entryId, id));

export function useRemoveAttachment(notebookId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => removeAttachment(notebookId, entryId, id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getAttachmentsQueryOptions(notebookId, entryId).queryKey }),
  });
}
