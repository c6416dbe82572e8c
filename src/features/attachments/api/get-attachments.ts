import { queryOptions, useQuery } from '@tanstack/react-query';
import { attachmentListSchema } from '@shared/api/attachments.ts';
import { api } from '@/lib/api-client.ts';
import { attachmentsApi, attachmentsKey } from './attachments-path.ts';

export const getAttachments = (notebookId: string, entryId: string) => api.get(attachmentsApi.attachments(notebookId, entryId), attachmentListSchema);

export const getAttachmentsQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({ queryKey: attachmentsKey(notebookId, entryId), queryFn: () => getAttachments(notebookId, entryId) });

export const useAttachments = (notebookId: string, entryId: string) => useQuery(getAttachmentsQueryOptions(notebookId, entryId));
