import type { EntityManager } from 'typeorm';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import type { AuditAction } from './audit-actions.ts';
import { GENESIS_HASH, chainHash } from './canonical-json.ts';

/** Key of the transaction-scoped advisory lock that serializes chain appends. */
export const AUDIT_CHAIN_LOCK = 0x61756469; // "audi"

export interface AuditEventInput {
  actorId: string | null;
  action: AuditAction;
  entityType: string;
  entityId?: string | null;
  notebookId?: string | null;
  summary?: Record<string, unknown>;
}

/**
 * Appends one event to the audit chain, inside the caller's transaction (so the event
 * commits or rolls back with the write it describes). Appends are serialized by an
 * advisory lock held until that transaction ends.
 */
export async function recordEvent(manager: EntityManager, input: AuditEventInput): Promise<AuditEventEntity> {
  if (!manager.queryRunner?.isTransactionActive) {
    throw new Error('recordEvent must run inside a transaction');
  }
  await manager.query('SELECT pg_advisory_xact_lock($1)', [AUDIT_CHAIN_LOCK]);
  const [last] = (await manager.query('SELECT hash FROM audit_event ORDER BY seq DESC LIMIT 1')) as { hash: string }[];
  const [{ seq }] = (await manager.query(`SELECT nextval(pg_get_serial_sequence('audit_event', 'seq'))::text AS seq`)) as { seq: string }[];
  const content = {
    seq,
    occurredAt: new Date(),
    actorId: input.actorId,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId ?? null,
    notebookId: input.notebookId ?? null,
    summary: input.summary ?? {},
  };
  const prevHash = last?.hash ?? GENESIS_HASH;
  const event = manager.create(AuditEventEntity, { ...content, prevHash, hash: chainHash(prevHash, content) });
  await manager.insert(AuditEventEntity, event as Parameters<typeof manager.insert<AuditEventEntity>>[1]);
  return event;
}
