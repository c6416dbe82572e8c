import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * The append-only audit trail. Each row's hash is SHA-256 over the previous row's hash
 * and this row's canonical content, so any later change breaks the chain. A trigger
 * refuses UPDATE, DELETE and TRUNCATE. Rows are written only by services/audit/record-event.ts.
 */
@Entity({ name: 'audit_event' })
export class AuditEventEntity {
  /** bigserial; pg returns it as a string. */
  @PrimaryColumn({ type: 'bigint' })
  seq: string;

  @Column({ type: 'timestamptz', name: 'occurred_at' })
  occurredAt: Date;

  @Column({ type: 'uuid', name: 'actor_id', nullable: true })
  actorId: string | null;

  @Column({ type: 'text' })
  action: string;

  @Column({ type: 'text', name: 'entity_type' })
  entityType: string;

  @Column({ type: 'text', name: 'entity_id', nullable: true })
  entityId: string | null;

  @Column({ type: 'uuid', name: 'notebook_id', nullable: true })
  notebookId: string | null;

  @Column({ type: 'jsonb' })
  summary: Record<string, unknown>;

  @Column({ type: 'text', name: 'prev_hash' })
  prevHash: string;

  @Column({ type: 'text' })
  hash: string;
}
