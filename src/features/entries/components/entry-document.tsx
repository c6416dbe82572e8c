import { useCallback, useEffect, useMemo, useRef, type ReactNode } from 'react';
import type { CellKind } from '@shared/cells/kinds.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import type { ResolvedRequest } from '@shared/cells/resolve.ts';
import type { DocumentJson } from '@shared/editor/document.ts';
import type { Model } from '@shared/engine/contract.ts';
import type { Editor } from '@tiptap/react';
import {
  CellNodeView,
  CellsContext,
  defaultCellInput,
  useCellRunner,
  type CellsRuntime,
} from '@/features/cells/index.ts';
import { EntryEditor } from '@/features/editor/index.ts';
import { Button } from '@/components/ui/button.tsx';
import { runCell } from '../api/run-cell.ts';
import { validateModel } from '../api/validate-model.ts';

type EntryDocumentProps = {
  notebookId: string;
  entryId: string;
  document: DocumentJson;
  outputs: CellOutputs;
  onDocument?: (doc: DocumentJson) => void;
  onOutputs?: (update: (prev: CellOutputs) => CellOutputs) => void;
  editable: boolean;
  /** Change it to load a different document into the editor. */
  editorKey: string;
  label?: string;
  /** Actions composed under each analysis cell's result (see CellsRuntime.cellExtras). */
  cellExtras?: (cell: { id: string; kind: CellKind }) => ReactNode;
  /** Receives the editor once it exists (and null when it goes), for commands from outside it. */
  onEditor?: (editor: Editor | null) => void;
};

/** A bar above the body: how many cells are stale or running, and one action to rerun the stale ones in order. */
function RunBar({ rt }: { rt: CellsRuntime }) {
  const ids = Object.keys(rt.freshness);
  const stale = ids.filter((id) => rt.freshness[id] === 'stale').length;
  const never = ids.filter((id) => rt.freshness[id] === 'never-run').length;
  const running = Object.keys(rt.running).length;
  if (stale + never + running === 0) return null;
  const parts = [
    stale ? `${stale} stale` : null,
    never ? `${never} not run yet` : null,
    running ? `${running} running` : null,
  ].filter(Boolean);
  return (
    <div
      role="status"
      className="mb-3 flex items-center gap-3 rounded-md border border-warning/40 bg-warning-soft px-4 py-2 text-sm text-ink"
    >
      <span>
        Cells: {parts.join(' · ')}
        {stale > 0 && (
          <span className="text-ink-muted"> — their inputs or models changed since they ran.</span>
        )}
      </span>
      {stale + never > 0 && (
        <Button size="sm" className="ml-auto" onClick={rt.runAllStale} disabled={running > 0}>
          Rerun {stale + never === 1 ? 'it' : `all ${stale + never}`} in order
        </Button>
      )}
    </div>
  );
}

const noOutputs = () => undefined;

/** The entry body with its cells' runtime: used for the working copy and, read-only, for old revisions. */
export function EntryDocument({
  notebookId,
  entryId,
  document,
  outputs,
  onDocument,
  onOutputs,
  editable,
  editorKey,
  label,
  cellExtras,
  onEditor,
}: EntryDocumentProps) {
  const send = useCallback(
    (cellId: string, request: ResolvedRequest, signal: AbortSignal) =>
      runCell(notebookId, entryId, cellId, request, signal),
    [notebookId, entryId],
  );
  const check = useCallback(
    async (model: Model, signal: AbortSignal) => (await validateModel(model, signal)).errors,
    [],
  );
  const runner = useCellRunner({
    doc: document,
    outputs,
    setOutputs: onOutputs ?? noOutputs,
    readOnly: !editable,
    send,
    validateModel: check,
  });
  const rt = useMemo(() => (cellExtras ? { ...runner, cellExtras } : runner), [runner, cellExtras]);
  const cellsRef = useRef(rt.cells);
  useEffect(() => {
    cellsRef.current = rt.cells;
  }, [rt.cells]);
  const createCellInput = useCallback((kind: CellKind) => defaultCellInput(kind, cellsRef.current), []);
  const initial = useMemo(() => document, [editorKey]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <CellsContext.Provider value={rt}>
      {editable && <RunBar rt={rt} />}
      <EntryEditor
        key={editorKey}
        initialContent={initial}
        editable={editable}
        onChange={onDocument}
        cellView={CellNodeView}
        createCellInput={createCellInput}
        label={label}
        onEditor={onEditor}
      />
    </CellsContext.Provider>
  );
}
