import type { EntityManager } from 'typeorm';
import type { AuditReference } from '@shared/api/audit.ts';
import { CELL_KIND_LABELS, CELL_KINDS, type CellKind } from '@shared/cells/kinds.ts';
import type { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { isUuid } from '@server/services/ids.ts';

/** Summary keys whose values are ids of people (besides every `…Id` key). */
const PERSON_LIST_KEYS = new Set(['mentions']);

const isRecord = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);

/** Every id an event names: its subject, its notebook, and the `…Id` values of its summary (also inside before/after). */
export function eventIds(event: Pick<AuditEventEntity, 'entityId' | 'notebookId' | 'summary'>): string[] {
  const ids = new Set<string>();
  const add = (v: unknown) => {
    if (typeof v === 'string' && isUuid(v)) ids.add(v.toLowerCase());
  };
  add(event.entityId);
  add(event.notebookId);
  const visit = (record: Record<string, unknown>) => {
    for (const [key, value] of Object.entries(record)) {
      if (key === 'before' || key === 'after') {
        if (isRecord(value)) visit(value);
      } else if (/Id$/.test(key)) add(value);
      else if (PERSON_LIST_KEYS.has(key) && Array.isArray(value)) value.forEach(add);
    }
  };
  visit(event.summary ?? {});
  return [...ids];
}

/** Cells an event names with the entry (and revision) whose document holds their name. */
function cellLookups(event: AuditEventEntity): { cellId: string; entryId: string; revisionId: string | null }[] {
  const s = event.summary ?? {};
  const entryId = typeof s.entryId === 'string' && isUuid(s.entryId) ? s.entryId : null;
  if (!entryId) return [];
  const revisionId = typeof s.revisionId === 'string' && isUuid(s.revisionId) ? s.revisionId : null;
  const cells = new Set<string>();
  if (event.entityType === 'cell' && event.entityId) cells.add(event.entityId);
  if (typeof s.cellId === 'string') cells.add(s.cellId);
  return [...cells].map((cellId) => ({ cellId, entryId, revisionId }));
}

const cellLabel = (kind: string | null, name: string | null): string => {
  const kindWords = kind && (CELL_KINDS as readonly string[]).includes(kind) ? CELL_KIND_LABELS[kind as CellKind] : 'A';
  return `${kindWords} cell${name?.trim() ? ` “${name.trim()}”` : ''}`;
};

/**
 * The ids of a page of events in words, in one query per kind of row whatever the page size:
 * notebooks, entries, revisions, people, reviews, attachments, comments, and cells (named in the
 * revision the event names, else in the entry's newest revision). Ids that name no row are left out.
 */
export async function resolveAuditReferences(manager: EntityManager, events: readonly AuditEventEntity[]): Promise<Map<string, AuditReference>> {
  const refs = new Map<string, AuditReference>();
  const ids = [...new Set(events.flatMap(eventIds))];
  const cells = events.flatMap(cellLookups);
  if (ids.length === 0 && cells.length === 0) return refs;

  type Row = { id: string; label: string; notebook_id: string | null; entry_id: string | null };
  const lookups: { kind: AuditReference['kind']; sql: string }[] = [
    { kind: 'notebook', sql: `SELECT id, title AS label, id AS notebook_id, NULL::uuid AS entry_id FROM notebook WHERE id = ANY($1::uuid[])` },
    { kind: 'entry', sql: `SELECT id, title AS label, notebook_id, id AS entry_id FROM entry WHERE id = ANY($1::uuid[])` },
    {
      kind: 'revision',
      sql: `SELECT r.id, 'revision ' || r.number AS label, e.notebook_id, r.entry_id FROM revision r JOIN entry e ON e.id = r.entry_id WHERE r.id = ANY($1::uuid[])`,
    },
    { kind: 'person', sql: `SELECT id, name AS label, NULL::uuid AS notebook_id, NULL::uuid AS entry_id FROM app_user WHERE id = ANY($1::uuid[])` },
    {
      kind: 'review',
      sql: `SELECT v.id, 'review of “' || e.title || '”' AS label, e.notebook_id, v.entry_id FROM review v JOIN entry e ON e.id = v.entry_id WHERE v.id = ANY($1::uuid[])`,
    },
    { kind: 'attachment', sql: `SELECT id, original_name AS label, notebook_id, entry_id FROM attachment WHERE id = ANY($1::uuid[])` },
    {
      kind: 'comment',
      sql: `SELECT c.id, 'comment on “' || e.title || '”' AS label, c.notebook_id, c.entry_id FROM comment c JOIN entry e ON e.id = c.entry_id WHERE c.id = ANY($1::uuid[])`,
    },
  ];
  if (ids.length > 0) {
    const results = await Promise.all(lookups.map(async ({ kind, sql }) => ({ kind, rows: (await manager.query(sql, [ids])) as Row[] })));
    for (const { kind, rows } of results) {
      for (const r of rows) {
        refs.set(r.id, { kind, label: r.label, ...(r.notebook_id ? { notebookId: r.notebook_id } : {}), ...(r.entry_id ? { entryId: r.entry_id } : {}) });
      }
    }
  }
  if (cells.length > 0) {
    const rows = (await manager.query(
      `SELECT c.cell_id, e.id AS entry_id, e.notebook_id, cell #>> '{attrs,kind}' AS kind, cell #>> '{attrs,input,name}' AS name
         FROM unnest($1::text[], $2::uuid[], $3::uuid[]) AS c(cell_id, entry_id, revision_id)
         JOIN entry e ON e.id = c.entry_id
         JOIN revision r ON r.id = COALESCE(c.revision_id, e.head_revision_id) AND r.entry_id = e.id
         CROSS JOIN LATERAL jsonb_path_query_first(r.document, '$.** ? (@.type == "cell" && @.attrs.id == $id)', jsonb_build_object('id', c.cell_id)) AS cell`,
      [cells.map((c) => c.cellId), cells.map((c) => c.entryId), cells.map((c) => c.revisionId)],
    )) as { cell_id: string; entry_id: string; notebook_id: string; kind: string | null; name: string | null }[];
    for (const r of rows) refs.set(r.cell_id, { kind: 'cell', label: cellLabel(r.kind, r.name), notebookId: r.notebook_id, entryId: r.entry_id });
  }
  return refs;
}

/** The references one event needs, out of a page's. */
export function referencesOf(event: AuditEventEntity, all: Map<string, AuditReference>): Record<string, AuditReference> {
  const own: Record<string, AuditReference> = {};
  for (const id of [...eventIds(event), ...cellLookups(event).map((c) => c.cellId)]) {
    const ref = all.get(id);
    if (ref) own[id] = ref;
  }
  return own;
}
