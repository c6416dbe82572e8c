import { createHash } from 'node:crypto';

/** JSON with object keys sorted at every depth: the same value always gives the same text. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

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
  const canonical = canonicalJson({ ...content, occurredAt: content.occurredAt.toISOString() });
  return createHash('sha256').update(`${prevHash}\n${canonical}`).digest('hex');
}
