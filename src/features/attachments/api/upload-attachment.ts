import { useMutation, useQueryClient } from '@tanstack/react-query';
import { csrfResponseSchema } from '@shared/api/auth.ts';
import { ATTACHMENT_LIMITS, attachmentSchema, type Attachment } from '@shared/api/attachments.ts';
import { ApiError, toApiError } from '@/lib/api-error.ts';
import { attachmentsApi } from './attachments-path.ts';
import { getAttachmentsQueryOptions } from './get-attachments.ts';

/**
 * Uploads one file as multipart/form-data with XMLHttpRequest, which reports upload progress
 * (fetch does not). `onProgress` receives the fraction sent, 0…1.
 */
export async function uploadAttachment(
  props: { notebookId: string; entryId: string; file: File; onProgress?: (fraction: number) => void; signal?: AbortSignal },
): Promise<Attachment> {
  if (props.file.size > ATTACHMENT_LIMITS.maxBytes) {
    throw new ApiError(413, 'payload_too_large', `"${props.file.name}" is larger than ${ATTACHMENT_LIMITS.maxBytes / (1024 * 1024)} MB`);
  }
  const csrf = csrfResponseSchema.parse(await (await fetch('/api/auth/csrf', { credentials: 'same-origin' })).json()).csrfToken;
  const form = new FormData();
  form.append('file', props.file, props.file.name);
  return new Promise<Attachment>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', attachmentsApi.attachments(props.notebookId, props.entryId));
    xhr.setRequestHeader('x-csrf-token', csrf);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) props.onProgress?.(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status === 201) {
        const parsed = attachmentSchema.safeParse(body);
        if (parsed.success) resolve(parsed.data);
        else reject(new ApiError(xhr.status, 'unexpected_response', "The server's answer did not have the expected shape."));
      } else reject(toApiError(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'));
    props.signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(form);
  });
}

export function useUploadAttachment(notebookId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (props: { file: File; onProgress?: (fraction: number) => void }) => uploadAttachment({ notebookId, entryId, ...props }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getAttachmentsQueryOptions(notebookId, entryId).queryKey }),
  });
}
