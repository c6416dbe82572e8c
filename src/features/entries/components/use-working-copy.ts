import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { Draft, DraftContent, EntryDetail, Revision } from '@shared/api/entries.ts';
import { canonicalJson } from '@shared/cells/hash.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';
import { isApiError } from '@/lib/api-error.ts';
import { saveDraft } from '../api/save-draft.ts';

/** The author's working copy: the same shape as the autosaved draft the server keeps. */
export type WorkingCopy = DraftContent;

export type DraftState =
  | { kind: 'clean' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: string }
  | { kind: 'error'; message: string };

/** Autosave waits this long after the last change. */
export const AUTOSAVE_DELAY_MS = 900;

export function fromRevision(r: Revision | Draft, baseRevisionId: string): WorkingCopy {
  return {
    baseRevisionId,
    title: r.title,
    entryDate: r.entryDate,
    tags: r.tags,
    document: r.document,
    outputs: r.outputs,
  };
}

/** Outputs of cells that are still in the document (removed cells leave none behind). */
export function keptOutputs(doc: DocumentJson, outputs: CellOutputs): CellOutputs {
  const ids = new Set(extractCells(doc).map((c) => c.id));
  return Object.fromEntries(Object.entries(outputs).filter(([id]) => ids.has(id)));
}

export function contentKey(
  w: Pick<WorkingCopy, 'title' | 'entryDate' | 'tags' | 'document' | 'outputs'>,
): string {
  return canonicalJson({
    title: w.title,
    entryDate: w.entryDate,
    tags: w.tags,
    document: w.document,
    outputs: keptOutputs(w.document, w.outputs),
  });
}

/**
 * The author's working copy of an entry: starts from their draft (or the head revision), is
 * autosaved as a per-person draft shortly after every change, and knows whether it differs from
 * the head revision (unrecorded changes).
 */
export function useWorkingCopy(notebookId: string, entryId: string, detail: EntryDetail, canWrite: boolean) {
  const [working, setWorking] = useState<WorkingCopy>(() =>
    detail.draft
      ? fromRevision(detail.draft, detail.draft.baseRevisionId)
      : fromRevision(detail.head, detail.head.id),
  );
  const [head, setHead] = useState<Revision>(detail.head);
  const [draft, setDraft] = useState<DraftState>(
    detail.draft ? { kind: 'saved', at: detail.draft.updatedAt } : { kind: 'clean' },
  );
  const [editorKey, setEditorKey] = useState(() => `${entryId}:${working.baseRevisionId}:0`);
  const version = useRef(0);
  const saved = useRef(0);
  const latest = useRef(working);
  useEffect(() => {
    latest.current = working;
  }, [working]);

  const update = useCallback((patch: Partial<WorkingCopy> | ((w: WorkingCopy) => Partial<WorkingCopy>)) => {
    version.current += 1;
    setWorking((w) => ({ ...w, ...(typeof patch === 'function' ? patch(w) : patch) }));
    setDraft({ kind: 'pending' });
  }, []);

  /** Replace the working copy wholesale (rebase, discard, after recording) and reload the editor. */
  const replace = useCallback(
    (next: WorkingCopy, opts: { dirty: boolean }) => {
      version.current += 1;
      if (!opts.dirty) saved.current = version.current;
      setWorking(next);
      setEditorKey(`${entryId}:${next.baseRevisionId}:${version.current}`);
      setDraft(opts.dirty ? { kind: 'pending' } : { kind: 'clean' });
    },
    [entryId],
  );

  const flush = useCallback(async () => {
    if (!canWrite || saved.current === version.current) return;
    const v = version.current;
    const w = latest.current;
    setDraft({ kind: 'saving' });
    try {
      const d = await saveDraft(notebookId, entryId, { ...w, outputs: keptOutputs(w.document, w.outputs) });
      saved.current = Math.max(saved.current, v);
      setDraft(version.current === v ? { kind: 'saved', at: d.updatedAt } : { kind: 'pending' });
    } catch (e) {
      const field = isApiError(e) ? e.fields[0] : undefined;
      setDraft({
        kind: 'error',
        message: field
          ? `${field.message} (${field.path})`
          : e instanceof Error
            ? e.message
            : 'The draft could not be saved',
      });
    }
  }, [canWrite, notebookId, entryId]);

  useEffect(() => {
    if (draft.kind !== 'pending') return;
    const t = setTimeout(() => void flush(), AUTOSAVE_DELAY_MS);
    return () => clearTimeout(t);
  }, [draft, working, flush]);

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (saved.current !== version.current) e.preventDefault();
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, []);

  const unrecorded = useMemo(
    () => working.baseRevisionId !== head.id || contentKey(working) !== contentKey(head),
    [working, head],
  );

  return { working, update, replace, head, setHead, draft, flush, editorKey, unrecorded };
}
