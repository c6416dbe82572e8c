import type { EntityManager } from 'typeorm';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { GENESIS_HASH, chainHash } from './canonical-json.ts';

export type AuditChainReport =
  | { ok: true; checked: number }
  | { ok: false; checked: number; brokenAt: string; reason: 'content_changed' | 'link_broken' };

/** Walks the whole chain in order and returns the first row whose link or hash does not hold. */
export async function verifyAuditChain(manager: EntityManager, batchSize = 1000): Promise<AuditChainReport> {
  let prevHash = GENESIS_HASH;
  let checked = 0;
  let after = '0';
  for (;;) {
    const rows = await manager
      .createQueryBuilder(AuditEventEntity, 'e')
      .where('e.seq > :after', { after })
      .orderBy('e.seq', 'ASC')
      .limit(batchSize)
      .getMany();
    if (rows.length === 0) return { ok: true, checked };
    for (const row of rows) {
      if (row.prevHash !== prevHash) return { ok: false, checked, brokenAt: row.seq, reason: 'link_broken' };
      const expected = chainHash(prevHash, {
        seq: row.seq,
        occurredAt: row.occurredAt,
        actorId: row.actorId,
        action: row.action,
        entityType: row.entityType,
        entityId: row.entityId,
        notebookId: row.notebookId,
        summary: row.summary,
      });
      if (expected !== row.hash) return { ok: false, checked, brokenAt: row.seq, reason: 'content_changed' };
      prevHash = row.hash;
      checked += 1;
      after = row.seq;
    }
  }
}
