import { Link } from 'react-router';
import type { AuditEvent, AuditReference } from '@shared/api/audit.ts';
import { paths } from '@/config/paths.ts';

/** One value in the details: words, where it leads (if anywhere), and the raw id or hash as a tooltip. */
export interface DetailValue {
  text: string;
  href?: string;
  title?: string;
}
export interface DetailLine {
  label: string;
  /** One value, or before → after. */
  values: DetailValue[];
}
export interface AuditDetails {
  /** What the action was about ("Ignition and extinction", "revision 4", "Dr. Kofi Mensah"). */
  subject?: DetailValue;
  /** The notebook it happened in, unless that is the subject. */
  notebook?: DetailValue;
  lines: DetailLine[];
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const HASH = /^[0-9a-f]{40,}$/i;

/** Field names in words; anything else is its camelCase split. */
const FIELD_WORDS: Record<string, string> = {
  entryId: 'entry',
  revisionId: 'revision',
  lastSeenRevisionId: 'last seen',
  userId: 'person',
  cellId: 'cell',
  commentId: 'comment',
  threadId: 'thread',
  signatureId: 'signature',
  restoredFromId: 'restored from',
  parentId: 'follows',
  resetId: 'reset',
  contentHash: 'content hash',
  inputHash: 'input hash',
  revisionContentHash: 'content hash',
  svgSha256: 'SVG hash',
  pngSha256: 'PNG hash',
  sha256: 'file hash',
  elapsedMs: 'time',
  byteSize: 'size',
  blockIndex: 'block',
  entryDate: 'entry date',
  siteRole: 'site role',
  contentType: 'type',
  printedName: 'printed name',
  engineVersion: 'engine',
  errorCode: 'error',
};

/** Subjects whose words already name their entry. */
const NAMES_ITS_ENTRY = new Set<AuditReference['kind']>(['entry', 'revision', 'review', 'comment']);

const fieldWords = (key: string) => FIELD_WORDS[key] ?? key.replace(/Id$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();

/** Where a reference leads in the app (people and unknown rows lead nowhere). */
export function referenceHref(ref: AuditReference): string | undefined {
  const { notebookId, entryId } = ref;
  if (ref.kind === 'notebook' && notebookId) return paths.notebook.getHref(notebookId);
  if (!notebookId || !entryId) return undefined;
  if (ref.kind === 'review' || ref.kind === 'comment') return paths.entryReview.getHref(notebookId, entryId);
  if (ref.kind === 'person') return undefined;
  return paths.entry.getHref(notebookId, entryId);
}

function value(v: unknown, key: string, refs: AuditEvent['references']): DetailValue {
  if (typeof v === 'string') {
    const ref = refs[v.toLowerCase()] ?? refs[v];
    if (ref) return { text: ref.label, href: referenceHref(ref), title: v };
    if (UUID.test(v)) return { text: `${v.slice(0, 8)}…`, title: v };
    if (HASH.test(v)) return { text: `${v.slice(0, 10)}…`, title: v };
    return { text: v.replace(/_/g, ' ') };
  }
  if (typeof v === 'number') {
    if (key === 'elapsedMs') return { text: v < 1000 ? `${Math.round(v)} ms` : `${(v / 1000).toFixed(1)} s` };
    if (key === 'byteSize') return { text: v < 1024 ? `${v} B` : v < 1048576 ? `${(v / 1024).toFixed(1)} kB` : `${(v / 1048576).toFixed(1)} MB` };
    if (key === 'blockIndex') return { text: String(v + 1) };
    return { text: String(v) };
  }
  if (typeof v === 'boolean') return { text: v ? 'yes' : 'no' };
  if (v === null || v === undefined) return { text: '—' };
  if (Array.isArray(v)) {
    if (v.length === 0) return { text: 'none' };
    const parts = v.map((x) => value(x, key, refs));
    return { text: parts.map((p) => p.text).join(', '), title: v.every((x) => typeof x === 'string') ? v.join(', ') : undefined };
  }
  return { text: JSON.stringify(v) };
}

const isRecord = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);

/**
 * An event's details in words: what it was about (linked where it leads somewhere), the notebook,
 * a recorded change as before → after, then the other recorded fields. Ids and hashes appear
 * only as tooltips (or shortened, when they name nothing that is left).
 */
export function auditDetails(ev: AuditEvent): AuditDetails {
  const refs = ev.references;
  // A subject whose row is not resolved (a membership) reads as the person it was about.
  const standIn = typeof ev.summary.userId === 'string' && !(ev.entityId && refs[ev.entityId.toLowerCase()]) ? ev.summary.userId : null;
  const subjectId = standIn ?? ev.entityId;
  const subjectRef = subjectId ? refs[subjectId.toLowerCase()] : undefined;
  const subject = subjectId ? value(subjectId, 'entityId', refs) : undefined;
  if (subject && standIn && ev.entityId) subject.title = `${ev.entityType} ${ev.entityId}`;
  if (subject && subjectRef?.kind === 'revision' && typeof ev.summary.entryId === 'string') {
    const entry = refs[ev.summary.entryId.toLowerCase()];
    if (entry) subject.text = `${entry.label}, ${subjectRef.label}`;
  }
  const notebook = ev.notebookId && subjectRef?.kind !== 'notebook' ? value(ev.notebookId, 'notebookId', refs) : undefined;
  const lines: DetailLine[] = [];
  const { before, after, ...rest } = ev.summary;
  if (isRecord(before) || isRecord(after)) {
    const b = isRecord(before) ? before : {};
    const a = isRecord(after) ? after : {};
    for (const k of [...new Set([...Object.keys(b), ...Object.keys(a)])]) lines.push({ label: fieldWords(k), values: [value(b[k], k, refs), value(a[k], k, refs)] });
  } else {
    if (before !== undefined) rest.before = before;
    if (after !== undefined) rest.after = after;
  }
  // Fields the subject already says: a revision's number, the entry of an entry's own part.
  const said = (k: string) =>
    (k === 'number' && subjectRef?.kind === 'revision') ||
    (k === 'userId' && standIn !== null) ||
    (k === 'entryId' && !!subjectRef && NAMES_ITS_ENTRY.has(subjectRef.kind) && subjectRef.entryId === rest.entryId);
  // Fields recorded empty (no thread, no mentions) say nothing.
  const empty = (v: unknown) => v === null || v === undefined || (Array.isArray(v) && v.length === 0);
  for (const [k, v] of Object.entries(rest)) {
    if (said(k) || empty(v)) continue;
    lines.push({ label: fieldWords(k), values: [value(v, k, refs)] });
  }
  return { subject, notebook, lines };
}

function ValueView({ v }: { v: DetailValue }) {
  if (v.href) {
    return (
      <Link to={v.href} title={v.title} className="text-accent underline decoration-accent/40 hover:decoration-accent">
        {v.text}
      </Link>
    );
  }
  return <span title={v.title}>{v.text}</span>;
}

/** The details cell of the audit table. */
export function AuditDetailsView({ event }: { event: AuditEvent }) {
  const { subject, notebook, lines } = auditDetails(event);
  return (
    <div className="space-y-0.5">
      {(subject || notebook) && (
        <p className="text-sm text-ink">
          {subject && <ValueView v={subject} />}
          {subject && notebook && <span className="text-ink-muted"> in </span>}
          {notebook && <ValueView v={notebook} />}
        </p>
      )}
      {lines.length > 0 && (
        <p className="text-xs text-ink-muted">
          {lines.map((line, i) => (
            <span key={i}>
              {i > 0 && ' · '}
              {line.label}:{' '}
              {line.values.map((v, k) => (
                <span key={k}>
                  {k > 0 && ' → '}
                  <ValueView v={v} />
                </span>
              ))}
            </span>
          ))}
        </p>
      )}
    </div>
  );
}
