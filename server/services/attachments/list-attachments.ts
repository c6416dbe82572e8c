import { IsNull } from 'typeorm';
import { AttachmentEntity } from '@server/entities/attachment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { NotFoundError } from '@server/errors/index.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { isUuid } from '@server/services/ids.ts';

/** An entry's attachments that have not been removed, newest first. */
export function listAttachments(ctx: ActingContext, entry: EntryEntity): Promise<AttachmentEntity[]> {
  return ctx.manager.find(AttachmentEntity, {
    where: { entryId: entry.id, removedAt: IsNull() },
    relations: { uploadedBy: true },
    order: { createdAt: 'DESC' },
  });
}

/** One attachment of the entry (removed ones are gone for readers too). */
export async function loadAttachment(ctx: ActingContext, entry: EntryEntity, attachmentId: string): Promise<AttachmentEntity> {
  if (!isUuid(attachmentId)) throw new NotFoundError('No such attachment');
  const row = await ctx.manager.findOne(AttachmentEntity, {
    where: { id: attachmentId, entryId: entry.id, removedAt: IsNull() },
    relations: { uploadedBy: true },
  });
  if (!row) throw new NotFoundError('No such attachment');
  return row;
}

/** Marks an attachment removed and records "attachment.removed"; the object stays for the record. */
export async function removeAttachment(ctx: ActingContext, entry: EntryEntity, attachmentId: string): Promise<void> {
  const row = await loadAttachment(ctx, entry, attachmentId);
  await ctx.manager.update(AttachmentEntity, { id: row.id }, { removedAt: new Date() });
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'attachment.removed',
    entityType: 'attachment',
    entityId: row.id,
    notebookId: entry.notebookId,
    summary: { entryId: entry.id, name: row.originalName, sha256: row.sha256 },
  });
}
