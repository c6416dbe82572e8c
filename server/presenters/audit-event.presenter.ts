import type { AuditEvent, AuditReference } from '@shared/api/audit.ts';
import type { AuditEventEntity } from '@server/entities/audit-event.entity.ts';

/** An audit row with its actor's name (null when the actor is unknown or the event had none). */
export type AuditEventWithActor = AuditEventEntity & { actorName: string | null };

/** An audit row with its actor's name and its ids in words (see resolve-audit-references.ts). */
export type AuditEventWithReferences = AuditEventWithActor & { references: Record<string, AuditReference> };

export function presentAuditEvent(e: AuditEventWithReferences): AuditEvent {
  return {
    sequence: e.seq,
    occurredAt: e.occurredAt.toISOString(),
    actor: e.actorId ? { id: e.actorId, name: e.actorName ?? '(unknown person)' } : null,
    action: e.action,
    entityType: e.entityType,
    entityId: e.entityId,
    notebookId: e.notebookId,
    summary: e.summary,
    hash: e.hash,
    prevHash: e.prevHash,
    references: e.references,
  };
}
