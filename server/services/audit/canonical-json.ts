import { createHash } from 'node:crypto';
import { canonicalJson } from '@shared/cells/hash.ts';

/**
 * Audit content is hashed as PostgreSQL's jsonb stores it: NaN and ±Infinity become null (as
 * JSON.stringify writes them), so `verifyAuditChain` recomputes the same hash from the rows.
 */
export const auditJson = (value: unknown): string => canonicalJson(value, { nonFinite: 'null' });

/** The first row's previous hash. */
export const GENESIS_HASH = '0'.repeat(64);

export interface AuditContent {
  seq: string;
  occurredAt: Date;
  actorId: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  notebookId: string | null;
  summary: Record<string, unknown>;
}

/** SHA-256 (hex) over the previous hash and this row's canonical content. */
export function chainHash(prevHash: string, content: AuditContent): string {
  const canonical = auditJson({ ...content, occurredAt: content.occurredAt.toISOString() });
  return createHash('sha256').update(`${prevHash}\n${canonical}`).digest('hex');
}
