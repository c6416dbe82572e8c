import type { Writable } from 'node:stream';
import type { EntityManager } from 'typeorm';
import { AUDIT_CSV_COLUMNS } from '@shared/api/audit.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import type { AuditEventWithActor } from '@server/presenters/audit-event.presenter.ts';
import { auditJson } from './canonical-json.ts';
import { auditQueryBuilder, fetchWithActor, type AuditFilter } from './list-audit-events.ts';
import { recordEvent } from './record-event.ts';

/** RFC 4180 field: quoted when it holds a comma, quote or line break; quotes doubled. A leading =, +, - or @ is prefixed with ' so spreadsheets do not run it. */
export function csvField(value: string | null): string {
  if (value === null) return '';
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function csvRow(e: AuditEventWithActor): string {
  const values = [e.seq, e.occurredAt.toISOString(), e.actorId, e.actorName, e.action, e.entityType, e.entityId, e.notebookId, auditJson(e.summary), e.hash];
  return `${values.map(csvField).join(',')}\r\n`;
}

/** Records that the actor exported this part of the trail (in its own transaction, before the rows are sent). */
export async function recordAuditExport(manager: EntityManager, actor: UserEntity, filter: AuditFilter): Promise<void> {
  await recordEvent(manager, { actorId: actor.id, action: 'audit.exported', entityType: 'audit', notebookId: filter.notebookId ?? null, summary: { filter } });
}

/** Writes every matching event as CSV, oldest first, in batches (the whole trail never sits in memory); stops if the reader goes away. */
export async function writeAuditCsv(manager: EntityManager, filter: AuditFilter, out: Writable, batchSize = 500): Promise<number> {
  out.write(`${AUDIT_CSV_COLUMNS.join(',')}\r\n`);
  let after = '0';
  let written = 0;
  for (;;) {
    const rows = await fetchWithActor(auditQueryBuilder(manager, filter).andWhere('e.seq > :after', { after }).orderBy('e.seq', 'ASC').limit(batchSize));
    if (rows.length === 0) return written;
    for (const row of rows) {
      if (out.destroyed) return written; // the caller went away
      if (!out.write(csvRow(row))) {
        await new Promise<void>((resolve) => {
          const done = () => {
            out.off('drain', done);
            out.off('close', done);
            resolve();
          };
          out.once('drain', done);
          out.once('close', done);
        });
      }
    }
    written += rows.length;
    after = rows[rows.length - 1].seq;
  }
}
