import type { Attachment } from '@shared/api/attachments.ts';
import type { AttachmentEntity } from '@server/entities/attachment.entity.ts';

export type AttachmentWithUploader = AttachmentEntity & { uploadedBy: { id: string; name: string } };

/** The app address that redirects to a short-lived signed address of the file. */
export function attachmentContentUrl(a: Pick<AttachmentEntity, 'id' | 'notebookId' | 'entryId'>): string {
  return `/api/notebooks/${a.notebookId}/entries/${a.entryId}/attachments/${a.id}/content`;
}

export function presentAttachment(a: AttachmentWithUploader): Attachment {
  return {
    id: a.id,
    entryId: a.entryId,
    notebookId: a.notebookId,
    name: a.originalName,
    contentType: a.contentType,
    byteSize: a.byteSize,
    sha256: a.sha256,
    uploadedBy: { id: a.uploadedBy.id, name: a.uploadedBy.name },
    createdAt: a.createdAt.toISOString(),
    contentUrl: attachmentContentUrl(a),
  };
}
