import type { EntryEntity } from '@server/entities/entry.entity.ts';
import type { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { DataSource } from 'typeorm';

/** Records "export.created" for a record or archive export of a revision. */
export function noteExport(dataSource: DataSource, props: { actor: UserEntity; entry: EntryEntity; revision: RevisionEntity; kind: 'record' | 'archive' }) {
  return dataSource.transaction((manager) =>
    recordEvent(manager, {
      actorId: props.actor.id,
      action: 'export.created',
      entityType: 'entry',
      entityId: props.entry.id,
      notebookId: props.entry.notebookId,
      summary: { entryId: props.entry.id, revisionId: props.revision.id, contentHash: props.revision.contentHash, kind: props.kind },
    }),
  );
}
