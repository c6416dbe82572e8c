import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { CellOutputs } from '@shared/cells/output.ts';
import {
  cellFreshness,
  needsRun,
  resolveFromCells,
  type Freshness,
  type ResolvedRequest,
} from '@shared/cells/resolve.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import type { FieldProblem } from '@shared/cells/inputs.ts';
import { extractCells, type DocumentJson } from '@shared/editor/document.ts';
import type { Model } from '@shared/engine/contract.ts';
import type { RunCellResponse } from '@shared/api/entries.ts';
import type { CellsRuntime, RunState } from './cells-context.tsx';

export interface CellRunnerOptions {
  doc: DocumentJson;
  outputs: CellOutputs;
  setOutputs: (update: (prev: CellOutputs) => CellOutputs) => void;
  readOnly: boolean;
  /** Sends the resolved request to the server. */
  send: (cellId: string, request: ResolvedRequest, signal: AbortSignal) => Promise<RunCellResponse>;
  validateModel: (model: Model, signal: AbortSignal) => Promise<FieldProblem[]>;
}

/**
 * The run state of an entry's cells. A rerun never drops the previous output: the new output
 * replaces it only once it has arrived; a cancelled or failed request leaves it as it was.
 */
export function useCellRunner(o: CellRunnerOptions): CellsRuntime {
  const { doc, outputs, setOutputs, readOnly, send, validateModel } = o;
  const cells = useMemo(() => extractCells(doc), [doc]);
  const [running, setRunning] = useState<Record<string, RunState>>({});
  const [runErrors, setRunErrors] = useState<Record<string, string>>({});
  const [cached, setCached] = useState<Record<string, boolean>>({});
  const [freshness, setFreshness] = useState<Record<string, Freshness>>({});
  const controllers = useRef(new Map<string, AbortController>());
  const cellsRef = useRef(cells);
  const freshRef = useRef(freshness);
  useEffect(() => {
    cellsRef.current = cells;
    freshRef.current = freshness;
  });

  const resolutions = useMemo(() => {
    const out: Record<string, ReturnType<typeof resolveFromCells>> = {};
    for (const c of cells) if (isAnalysisKind(c.kind)) out[c.id] = resolveFromCells(cells, c);
    return out;
  }, [cells]);

  const problems = useMemo(() => {
    const out: Record<string, FieldProblem[]> = {};
    for (const [id, r] of Object.entries(resolutions)) if (!r.ok) out[id] = r.problems;
    return out;
  }, [resolutions]);

  useEffect(() => {
    let alive = true;
    void (async () => {
      const next: Record<string, Freshness> = {};
      for (const [id, r] of Object.entries(resolutions)) next[id] = await cellFreshness(r, outputs[id]);
      if (alive) setFreshness(next);
    })();
    return () => {
      alive = false;
    };
  }, [resolutions, outputs]);

  const runOne = useCallback(
    async (cellId: string): Promise<void> => {
      const cell = cellsRef.current.find((c) => c.id === cellId);
      if (!cell) return;
      const r = resolveFromCells(cellsRef.current, cell);
      if (!r.ok) return;
      controllers.current.get(cellId)?.abort();
      const controller = new AbortController();
      controllers.current.set(cellId, controller);
      setRunning((m) => ({ ...m, [cellId]: { startedAt: Date.now() } }));
      setRunErrors(({ [cellId]: _drop, ...rest }) => rest);
      try {
        const { cached: wasCached, ...output } = await send(cellId, r.request, controller.signal);
        setOutputs((prev) => ({ ...prev, [cellId]: output }));
        setCached((m) => ({ ...m, [cellId]: wasCached }));
      } catch (e) {
        if ((e as Error).name !== 'AbortError') {
          setRunErrors((m) => ({ ...m, [cellId]: e instanceof Error ? e.message : 'The run failed' }));
        }
      } finally {
        if (controllers.current.get(cellId) === controller) {
          controllers.current.delete(cellId);
          setRunning(({ [cellId]: _drop, ...rest }) => rest);
        }
      }
    },
    [send, setOutputs],
  );

  const run = useCallback((cellId: string) => void runOne(cellId), [runOne]);
  const cancel = useCallback((cellId: string) => controllers.current.get(cellId)?.abort(), []);
  const runAllStale = useCallback(() => {
    void (async () => {
      const order = cellsRef.current.filter(
        (c) => isAnalysisKind(c.kind) && needsRun(freshRef.current[c.id] ?? 'never-run'),
      );
      for (const c of order) await runOne(c.id);
    })();
  }, [runOne]);

  useEffect(() => {
    const map = controllers.current;
    return () => map.forEach((c) => c.abort());
  }, []);

  return {
    readOnly,
    doc,
    cells,
    outputs,
    running,
    freshness,
    problems,
    runErrors,
    cached,
    run,
    cancel,
    runAllStale,
    validateModel,
  };
}
