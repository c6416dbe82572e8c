import { z } from 'zod';

/**
 * The audit trail, read side.
 *
 * GET /api/audit?notebookId=&entryId=&actorId=&action=&from=&to=&page=&pageSize=   auditQuery -> auditPage
 * GET /api/audit?…&format=csv                                                      -> text/csv (every matching row, no paging)
 * GET /api/audit/verify                                                            -> auditVerifyReport (administrators)
 *
 * Who may: with entryId or notebookId, that notebook's PIs and administrators; with only actorId,
 * that person themselves and administrators; with none of these, administrators only.
 * Others get 403 (404 when they are not a member of the notebook).
 */

export const AUDIT_LIMITS = {
  pageSizeDefault: 50,
  pageSizeMax: 200,
} as const;

/** YYYY-MM-DD or a full ISO date-time; `to` as a date includes that whole day. */
const dateBound = z.union([z.iso.date(), z.iso.datetime({ offset: true })], {
  message: 'Use a date (YYYY-MM-DD) or an ISO date-time',
});

export const auditQuerySchema = z.object({
  notebookId: z.uuid({ message: 'notebookId must be a notebook id' }).optional(),
  entryId: z.uuid({ message: 'entryId must be an entry id' }).optional(),
  actorId: z.uuid({ message: 'actorId must be a person id' }).optional(),
  action: z
    .string()
    .regex(/^[a-z_]+(\.[a-z_]+)?$/, { message: 'action is an audit action such as "review.approved" or a prefix such as "review"' })
    .optional(),
  from: dateBound.optional(),
  to: dateBound.optional(),
  page: z.coerce.number({ message: 'page must be a number' }).int().min(1, { message: 'page starts at 1' }).default(1),
  pageSize: z.coerce
    .number({ message: 'pageSize must be a number' })
    .int()
    .min(1)
    .max(AUDIT_LIMITS.pageSizeMax, { message: `pageSize is at most ${AUDIT_LIMITS.pageSizeMax}` })
    .default(AUDIT_LIMITS.pageSizeDefault),
  format: z.enum(['json', 'csv']).default('json'),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;
export type AuditQueryInput = z.input<typeof auditQuerySchema>;

/** What a reference in an audit event names. */
export const AUDIT_REFERENCE_KINDS = ['notebook', 'entry', 'revision', 'person', 'cell', 'review', 'attachment', 'comment'] as const;
export type AuditReferenceKind = (typeof AUDIT_REFERENCE_KINDS)[number];

/**
 * An id in an event (its subject, notebook, or an id in its summary) resolved to words when the
 * list was read: the notebook's name, the entry's title, "revision 4", the person's name, the
 * cell's kind and name. `notebookId` and `entryId` say where it leads in the app; a reference
 * whose row is gone is simply absent (the id then shows as it is).
 */
export const auditReferenceSchema = z.object({
  kind: z.enum(AUDIT_REFERENCE_KINDS),
  label: z.string(),
  notebookId: z.uuid().optional(),
  entryId: z.uuid().optional(),
});
export type AuditReference = z.infer<typeof auditReferenceSchema>;

export const auditEventSchema = z.object({
  /** Position in the chain (a decimal string: it is a bigint). */
  sequence: z.string(),
  occurredAt: z.string(),
  actor: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  notebookId: z.uuid().nullable(),
  /** Before/after summary of the change, as recorded. */
  summary: z.record(z.string(), z.unknown()),
  hash: z.string(),
  prevHash: z.string(),
  /** The event's ids in words, keyed by id (subject, notebook, summary values). */
  references: z.record(z.string(), auditReferenceSchema),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditPageSchema = z.object({
  events: z.array(auditEventSchema),
  page: z.number().int(),
  pageSize: z.number().int(),
  total: z.number().int(),
});
export type AuditPage = z.infer<typeof auditPageSchema>;

export const auditVerifyReportSchema = z.object({
  ok: z.boolean(),
  checked: z.number().int(),
  /** The sequence of the first row whose link or content does not hold. */
  firstBrokenSequence: z.string().optional(),
  reason: z.enum(['content_changed', 'link_broken']).optional(),
});
export type AuditVerifyReport = z.infer<typeof auditVerifyReportSchema>;

/** Columns of the CSV export, in order. */
export const AUDIT_CSV_COLUMNS = ['sequence', 'occurred_at', 'actor_id', 'actor_name', 'action', 'entity_type', 'entity_id', 'notebook_id', 'summary', 'hash'] as const;
