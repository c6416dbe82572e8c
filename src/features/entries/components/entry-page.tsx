import { useQueryClient } from '@tanstack/react-query';
import type { Editor } from '@tiptap/react';
import { useCallback, useState, type ReactNode } from 'react';
import { ENTRY_STATUS_LABELS, type EntryDetail, type EntrySummary, type Revision } from '@shared/api/entries.ts';
import type { CellKind } from '@shared/cells/kinds.ts';
import { mergeDocuments, mergeValue } from '@shared/editor/merge.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Input } from '@/components/ui/input.tsx';
import { QueryError } from '@/components/ui/query-error.tsx';
import { SkeletonBlock } from '@/components/ui/skeleton.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { entriesKey } from '../api/get-entries.ts';
import { getEntryQueryOptions, useEntry } from '../api/get-entry.ts';
import { getRevision } from '../api/get-revision.ts';
import { recordRevision, RevisionConflict } from '../api/record-revision.ts';
import { useRestoreRevision } from '../api/restore-revision.ts';
import { discardDraft } from '../api/save-draft.ts';
import { ConflictDialog } from './conflict-dialog.tsx';
import { EntryDocument } from './entry-document.tsx';
import { RecordRevisionDialog } from './record-revision-dialog.tsx';
import { RevisionHistory, RevisionReader } from './revision-history.tsx';
import {
  fromRevision,
  keptOutputs,
  useWorkingCopy,
  type DraftState,
  type WorkingCopy,
} from './use-working-copy.ts';
import type { DiffSide } from './text-diff.tsx';

/** What the page hands to the parts a route composes around the entry. */
export interface EntrySlotContext {
  entry: EntrySummary;
  /** The newest recorded revision (what reviews, figures and exports refer to). */
  head: Revision;
  /** True when the working copy has changes not yet recorded as a revision. */
  unrecorded: boolean;
  /** Places an image in the working document at the cursor (researchers and PIs only). */
  insertImage?: (image: { src: string; alt: string }) => void;
}

/** Places where a route adds other features' parts (reviews, files, exports) to the entry page. */
export interface EntryPageSlots {
  /** Buttons beside "History" and "Record revision". */
  headerActions?: (ctx: EntrySlotContext) => ReactNode;
  /** Above the document (e.g. the signatures on the head revision). */
  beforeDocument?: (ctx: EntrySlotContext) => ReactNode;
  /** Below the document (e.g. attachments and measured data). */
  afterDocument?: (ctx: EntrySlotContext) => ReactNode;
  /** Under each analysis cell's result (e.g. "attach as figure"). */
  cellExtras?: (cell: { id: string; kind: CellKind }, ctx: EntrySlotContext) => ReactNode;
}

type EntryPageProps = { notebookId: string; entryId: string; canWrite: boolean; slots?: EntryPageSlots };

/** The entry page: loads the entry, then the editor with its working copy. */
export function EntryPage({ notebookId, entryId, canWrite, slots }: EntryPageProps) {
  const q = useEntry(notebookId, entryId);
  if (q.isPending) return <SkeletonBlock lines={8} label="Loading the entry" />;
  if (q.isError) return <QueryError error={q.error} what="the entry" onRetry={() => void q.refetch()} />;
  return (
    <EntryWorkspace
      key={entryId}
      notebookId={notebookId}
      entryId={entryId}
      canWrite={canWrite}
      detail={q.data}
      slots={slots}
    />
  );
}

function DraftIndicator({ draft, unrecorded }: { draft: DraftState; unrecorded: boolean }) {
  const text =
    draft.kind === 'pending'
      ? 'Unsaved changes…'
      : draft.kind === 'saving'
        ? 'Saving draft…'
        : draft.kind === 'error'
          ? `Draft not saved: ${draft.message}`
          : draft.kind === 'saved'
            ? `Draft saved ${new Date(draft.at).toLocaleTimeString(undefined, { timeStyle: 'short' })}`
            : null;
  return (
    <span
      role="status"
      aria-live="polite"
      className="flex items-center gap-2 text-xs"
      data-testid="save-state"
    >
      {unrecorded ? <Badge tone="warning">unrecorded changes</Badge> : <Badge tone="success">recorded</Badge>}
      {text && <span className={draft.kind === 'error' ? 'text-unstable' : 'text-ink-muted'}>{text}</span>}
    </span>
  );
}

const tagsText = (tags: string[]) => tags.join(', ');
const parseTags = (text: string) =>
  text
    .split(',')
    .map((t) => t.trim())
    .filter(Boolean);

function EntryWorkspace({
  notebookId,
  entryId,
  canWrite,
  detail,
  slots,
}: EntryPageProps & { detail: EntryDetail }) {
  const qc = useQueryClient();
  const wc = useWorkingCopy(notebookId, entryId, detail, canWrite);
  const { working, update, head } = wc;
  const [recordOpen, setRecordOpen] = useState(false);
  const [recording, setRecording] = useState(false);
  const [recordError, setRecordError] = useState<string>();
  const [conflict, setConflict] = useState<{
    current: Revision;
    base: DiffSide | null;
    baseDoc: WorkingCopy | null;
  } | null>(null);
  const [historyOpen, setHistoryOpen] = useState(false);
  const [reading, setReading] = useState<string | null>(null);
  const [tagsDraft, setTagsDraft] = useState(tagsText(working.tags));
  const restore = useRestoreRevision(notebookId, entryId);
  const [editor, setEditor] = useState<Editor | null>(null);
  /** Through the editor's own command: the picture goes where the cursor is, like the toolbar's. */
  const insertImage = useCallback(
    (image: { src: string; alt: string }) => void editor?.chain().focus().insertImage(image).run(),
    [editor],
  );
  const slotCtx: EntrySlotContext = {
    entry: detail.entry,
    head,
    unrecorded: wc.unrecorded,
    insertImage: canWrite ? insertImage : undefined,
  };
  const cellExtras = slots?.cellExtras;
  const extrasForCell = useCallback(
    (cell: { id: string; kind: CellKind }) => cellExtras?.(cell, slotCtx),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [cellExtras, head.id, wc.unrecorded],
  );

  const afterNewHead = (rev: Revision) => {
    wc.setHead(rev);
    wc.replace(fromRevision(rev, rev.id), { dirty: false });
    setTagsDraft(tagsText(rev.tags));
    qc.setQueryData(getEntryQueryOptions(notebookId, entryId).queryKey, (d) =>
      d ? { ...d, head: rev, draft: null } : d,
    );
    void qc.invalidateQueries({ queryKey: entriesKey(notebookId) });
    void discardDraft(notebookId, entryId).catch(() => undefined);
  };

  const record = async (message: string) => {
    setRecording(true);
    setRecordError(undefined);
    try {
      const rev = await recordRevision(notebookId, entryId, {
        ...working,
        outputs: keptOutputs(working.document, working.outputs),
        message: message || undefined,
      });
      setRecordOpen(false);
      afterNewHead(rev);
      toast.success(`Recorded revision #${rev.number}`);
    } catch (e) {
      if (e instanceof RevisionConflict) {
        setRecordOpen(false);
        wc.setHead(e.current);
        setConflict({ current: e.current, base: null, baseDoc: null });
        const base = await getRevision(notebookId, entryId, working.baseRevisionId).catch(() => null);
        setConflict({ current: e.current, base, baseDoc: base ? fromRevision(base, base.id) : null });
      } else {
        const field = isApiError(e) ? e.fields[0] : undefined;
        setRecordError(
          field
            ? `${field.message} (${field.path})`
            : e instanceof Error
              ? e.message
              : 'The revision was not recorded',
        );
      }
    } finally {
      setRecording(false);
    }
  };

  const rebase = () => {
    if (!conflict?.baseDoc) return;
    const base = conflict.baseDoc;
    const theirs = conflict.current;
    const merged = mergeDocuments(base.document, working.document, theirs.document);
    const next: WorkingCopy = {
      baseRevisionId: theirs.id,
      title: mergeValue(base.title, working.title, theirs.title),
      entryDate: mergeValue(base.entryDate, working.entryDate, theirs.entryDate),
      tags: mergeValue(base.tags, working.tags, theirs.tags),
      document: merged.doc,
      outputs: keptOutputs(merged.doc, { ...theirs.outputs, ...working.outputs }),
    };
    wc.replace(next, { dirty: true });
    setTagsDraft(tagsText(next.tags));
    setConflict(null);
    toast.show({
      tone: merged.conflicts ? 'info' : 'success',
      title: `Your changes now sit on revision #${theirs.number}`,
      message: merged.conflicts
        ? `${merged.conflicts} place${merged.conflicts === 1 ? '' : 's'} where you both changed the same block: both versions are kept, theirs first. Tidy them, then record.`
        : 'Check the result, then record it.',
    });
  };

  const takeTheirs = () => {
    if (!conflict) return;
    afterNewHead(conflict.current);
    setConflict(null);
  };

  const doRestore = (r: Revision) => {
    restore.mutate(
      { revisionId: r.id, baseRevisionId: head.id },
      {
        onSuccess: (rev) => {
          setReading(null);
          afterNewHead(rev);
          toast.success(`Restored revision #${r.number} as revision #${rev.number}`);
        },
        onError: (e) => toast.error('Not restored', e instanceof Error ? e.message : undefined),
      },
    );
  };

  const staleBase =
    detail.draft && detail.draft.baseRevisionId !== detail.head.id && working.baseRevisionId !== head.id;

  return (
    <div className={historyOpen ? 'grid gap-6 xl:grid-cols-[minmax(0,1fr)_18rem]' : ''}>
      <div className="min-w-0">
        {reading ? (
          <RevisionReader
            notebookId={notebookId}
            entryId={entryId}
            revisionId={reading}
            headId={head.id}
            canRestore={canWrite}
            restoring={restore.isPending}
            onRestore={doRestore}
            onClose={() => setReading(null)}
          />
        ) : (
          <>
            <div className="mb-4 flex flex-wrap items-start gap-3">
              <div className="w-full">
                {canWrite ? (
                  <input
                    aria-label="Title"
                    value={working.title}
                    onChange={(e) => update({ title: e.target.value })}
                    className="w-full rounded-sm border border-transparent bg-transparent font-serif text-3xl font-bold text-ink hover:border-rule focus:border-rule-strong"
                  />
                ) : (
                  <h1 className="font-serif text-3xl font-bold">{working.title}</h1>
                )}
                {!working.title.trim() && <p className="text-sm font-medium text-unstable">Enter a title</p>}
                <div className="mt-2 flex flex-wrap items-center gap-3 text-sm text-ink-muted">
                  <Badge
                    tone={
                      detail.entry.status === 'approved'
                        ? 'success'
                        : detail.entry.status === 'changes-requested'
                          ? 'unstable'
                          : detail.entry.status === 'in-review'
                            ? 'accent'
                            : 'neutral'
                    }
                  >
                    {ENTRY_STATUS_LABELS[detail.entry.status]}
                  </Badge>
                  <span>by {detail.entry.author.name}</span>
                  {canWrite ? (
                    <>
                      <label className="flex w-52 items-center gap-1">
                        <span>Date</span>
                        <Input
                          type="date"
                          className="h-8 text-sm"
                          value={working.entryDate}
                          onChange={(e) => update({ entryDate: e.target.value })}
                        />
                      </label>
                      <label className="flex w-80 items-center gap-1">
                        <span>Tags</span>
                        <Input
                          className="h-8 text-sm"
                          value={tagsDraft}
                          placeholder="ignition, continuation"
                          onChange={(e) => {
                            setTagsDraft(e.target.value);
                            update({ tags: parseTags(e.target.value) });
                          }}
                        />
                      </label>
                    </>
                  ) : (
                    <span>
                      {working.entryDate}
                      {working.tags.length > 0 && ` · ${working.tags.join(', ')}`}
                    </span>
                  )}
                </div>
              </div>
              <div className="flex w-full flex-wrap items-center justify-between gap-2">
                <div className="flex flex-wrap gap-2">
                  {slots?.headerActions?.(slotCtx)}
                  <Button
                    variant="secondary"
                    size="sm"
                    aria-pressed={historyOpen}
                    onClick={() => setHistoryOpen((h) => !h)}
                  >
                    History ({head.number})
                  </Button>
                  {canWrite && (
                    <Button
                      size="sm"
                      disabled={!wc.unrecorded || !working.title.trim()}
                      onClick={() => setRecordOpen(true)}
                    >
                      Record revision
                    </Button>
                  )}
                </div>
                {canWrite && <DraftIndicator draft={wc.draft} unrecorded={wc.unrecorded} />}
              </div>
            </div>
            {staleBase && (
              <p className="mb-3 rounded-md border border-warning/40 bg-warning-soft px-4 py-2 text-sm">
                Your draft started from an earlier revision; revision #{head.number} has been recorded since.
                Recording will show you what changed and let you rebase.
              </p>
            )}
            {slots?.beforeDocument?.(slotCtx)}
            <EntryDocument
              notebookId={notebookId}
              entryId={entryId}
              document={working.document}
              outputs={working.outputs}
              onDocument={(document) => update({ document })}
              onOutputs={(f) => update((w) => ({ outputs: f(w.outputs) }))}
              editable={canWrite}
              editorKey={wc.editorKey}
              cellExtras={slots?.cellExtras ? extrasForCell : undefined}
              onEditor={setEditor}
            />
            {slots?.afterDocument?.(slotCtx)}
          </>
        )}
      </div>
      {historyOpen && (
        <aside className="xl:sticky xl:top-4 xl:self-start">
          <h2 className="mb-2 text-sm font-semibold tracking-wide text-ink-muted uppercase">History</h2>
          <RevisionHistory
            notebookId={notebookId}
            entryId={entryId}
            headId={head.id}
            openId={reading}
            onOpen={setReading}
          />
        </aside>
      )}
      <RecordRevisionDialog
        open={recordOpen}
        onClose={() => setRecordOpen(false)}
        onRecord={(m) => void record(m)}
        busy={recording}
        error={recordError}
        nextNumber={head.number + 1}
      />
      {conflict && (
        <ConflictDialog
          open
          base={conflict.base}
          mine={working}
          current={conflict.current}
          onRebase={rebase}
          onTakeTheirs={takeTheirs}
          onClose={() => setConflict(null)}
        />
      )}
    </div>
  );
}
