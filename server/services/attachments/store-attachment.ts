import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { DataSource } from 'typeorm';
import { AttachmentEntity } from '@server/entities/attachment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { contentDisposition } from './content-disposition.ts';
import type { ReceivedFile } from './receive-upload.ts';
import { attachmentKey } from './storage-keys.ts';
import { StorageUnavailableError } from './upload-errors.ts';

/**
 * Stores a received file and records it: the object first (streamed from the spool file), then
 * the row and its "attachment.added" event in one transaction. When storage fails nothing is
 * recorded (503); when the transaction fails the stored object is deleted again.
 */
export async function storeAttachment(
  deps: { dataSource: DataSource; storage: FileStorage },
  props: { actor: UserEntity; entry: EntryEntity; file: ReceivedFile },
): Promise<AttachmentEntity> {
  const { entry, file, actor } = props;
  const id = randomUUID();
  const key = attachmentKey(entry.notebookId, entry.id, id);
  try {
    await deps.storage.putStream(key, createReadStream(file.tempPath), {
      contentType: file.contentType,
      byteLength: file.byteSize,
      contentDisposition: contentDisposition(file.name),
    });
  } catch (error) {
    console.error(`[attachments] storing ${key} failed: ${(error as Error).message}`);
    await deps.storage.delete(key).catch(() => undefined);
    throw new StorageUnavailableError();
  } finally {
    await file.discard();
  }
  try {
    return await deps.dataSource.transaction(async (manager) => {
      const row = manager.create(AttachmentEntity, {
        id,
        notebookId: entry.notebookId,
        entryId: entry.id,
        uploadedById: actor.id,
        storageKey: key,
        originalName: file.name,
        contentType: file.contentType,
        byteSize: file.byteSize,
        sha256: file.sha256,
        removedAt: null,
      });
      await manager.insert(AttachmentEntity, row);
      await recordEvent(manager, {
        actorId: actor.id,
        action: 'attachment.added',
        entityType: 'attachment',
        entityId: id,
        notebookId: entry.notebookId,
        summary: { entryId: entry.id, name: file.name, contentType: file.contentType, byteSize: file.byteSize, sha256: file.sha256 },
      });
      return manager.findOneOrFail(AttachmentEntity, { where: { id }, relations: { uploadedBy: true } });
    });
  } catch (error) {
    // No row points at the object: remove it so nothing is left orphaned.
    await deps.storage.delete(key).catch((e: Error) => console.error(`[attachments] orphan ${key} not removed: ${e.message}`));
    throw error;
  }
}
