import { IsNull } from 'typeorm';
import { ATTACHMENT_LIMITS } from '@shared/api/attachments.ts';
import { extractCells } from '@shared/editor/document.ts';
import { AttachmentEntity } from '@server/entities/attachment.entity.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { FigureEntity } from '@server/entities/figure.entity.ts';
import { MeasurementSetEntity } from '@server/entities/measurement-set.entity.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { RevisionEntity } from '@server/entities/revision.entity.ts';
import { SignatureEntity } from '@server/entities/signature.entity.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';

export interface AuditRow {
  seq: string;
  occurredAt: string;
  action: string;
  actorName: string | null;
  entityType: string;
  entityId: string | null;
  summary: Record<string, unknown>;
  hash: string;
}

/** Everything an exported record shows about one revision of an entry. */
export interface EntryRecord {
  notebookTitle: string;
  entry: EntryEntity;
  revision: RevisionEntity & { author: { name: string } };
  figures: FigureEntity[];
  attachments: AttachmentEntity[];
  measurements: MeasurementSetEntity[];
  signatures: SignatureEntity[];
  audit: AuditRow[];
}

/** Loads the record of `revision`: its figures, the entry's files and data, the revision's signatures, the entry's audit trail. */
export async function loadEntryRecord(ctx: ActingContext, entry: EntryEntity, revision: RevisionEntity & { author: { name: string } }): Promise<EntryRecord> {
  const m = ctx.manager;
  const [notebook, figures, attachments, measurements, signatures, audit] = await Promise.all([
    m.findOneOrFail(NotebookEntity, { where: { id: entry.notebookId } }),
    m.find(FigureEntity, { where: { entryId: entry.id, revisionId: revision.id }, order: { createdAt: 'ASC' } }),
    m.find(AttachmentEntity, { where: { entryId: entry.id, removedAt: IsNull() }, order: { createdAt: 'ASC' } }),
    m.find(MeasurementSetEntity, { where: { entryId: entry.id }, order: { createdAt: 'ASC' } }),
    m.find(SignatureEntity, { where: { revisionId: revision.id }, order: { signedAt: 'ASC' } }),
    m.query(
      `SELECT e.seq::text AS seq, e.occurred_at AS "occurredAt", e.action, u.name AS "actorName", e.entity_type AS "entityType",
              e.entity_id AS "entityId", e.summary, e.hash
         FROM audit_event e LEFT JOIN app_user u ON u.id = e.actor_id
        WHERE e.entity_id = $1 OR e.summary->>'entryId' = $1
        ORDER BY e.seq`,
      [entry.id],
    ) as Promise<(Omit<AuditRow, 'occurredAt'> & { occurredAt: Date })[]>,
  ]);
  return {
    notebookTitle: notebook.title,
    entry,
    revision,
    figures,
    attachments,
    measurements,
    signatures,
    audit: audit.map((a) => ({ ...a, occurredAt: new Date(a.occurredAt).toISOString() })),
  };
}

/** Cells of the revision that have a stored result, in reading order. */
export function cellsWithResults(revision: RevisionEntity) {
  return extractCells(revision.document).filter((c) => revision.outputs[c.id]?.status === 'ok');
}

export const signedUrlSeconds = ATTACHMENT_LIMITS.signedUrlSeconds;
