import { z } from 'zod';
import { personRefSchema } from './entries.ts';

/**
 * Files attached to an entry. Paths are under /api/notebooks/:notebookId/entries/:entryId.
 *
 * POST   /attachments                    multipart/form-data, one part named "file" -> 201 attachment
 *                                        (413 too large, 415 type not accepted or not what the name says,
 *                                        503 file storage unreachable: nothing is kept)
 * GET    /attachments                                        -> attachmentList (newest first)
 * GET    /attachments/:attachmentId                          -> attachment
 * GET    /attachments/:attachmentId/content                  -> 302 to a short-lived signed address
 * DELETE /attachments/:attachmentId                          -> 204 (the file stays in storage for the record)
 *
 * Readers read and download; researchers and PIs upload and remove; non-members get 404.
 */

/** Limits on uploads; documented here, enforced by the upload service. */
export const ATTACHMENT_LIMITS = {
  /** Bytes in one uploaded file. */
  maxBytes: 25 * 1024 * 1024,
  /** Characters of the original file name kept. */
  nameMax: 200,
  /** Seconds a download address stays valid. */
  signedUrlSeconds: 300,
} as const;

/** What may be attached, by the content type recognised from the file's bytes. */
export const ATTACHMENT_TYPES = ['image/png', 'image/jpeg', 'image/gif', 'image/webp', 'application/pdf', 'text/csv', 'text/plain'] as const;
export type AttachmentType = (typeof ATTACHMENT_TYPES)[number];

/** Types that can be placed inline in the text as an image. */
export const INLINE_IMAGE_TYPES: readonly AttachmentType[] = ['image/png', 'image/jpeg', 'image/gif', 'image/webp'];

/** What the file picker offers (the server still checks the bytes). */
export const ATTACHMENT_ACCEPT = '.png,.jpg,.jpeg,.gif,.webp,.pdf,.csv,.txt,image/png,image/jpeg,image/gif,image/webp,application/pdf,text/csv,text/plain';

export const attachmentSchema = z.object({
  id: z.uuid(),
  entryId: z.uuid(),
  notebookId: z.uuid(),
  name: z.string(),
  contentType: z.enum(ATTACHMENT_TYPES),
  byteSize: z.number().int().min(0),
  /** SHA-256 of the stored bytes, hex. */
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  uploadedBy: personRefSchema,
  createdAt: z.string(),
  /** Stable app address of the file (redirects to a short-lived signed address); usable as an image src. */
  contentUrl: z.string(),
});
export type Attachment = z.infer<typeof attachmentSchema>;

export const attachmentListSchema = z.object({ attachments: z.array(attachmentSchema) });
export type AttachmentList = z.infer<typeof attachmentListSchema>;

/** Error codes specific to uploads. */
export const UPLOAD_ERROR_CODES = {
  unsupportedType: 'unsupported_file_type',
  typeMismatch: 'file_type_mismatch',
  storageUnavailable: 'storage_unavailable',
} as const;
