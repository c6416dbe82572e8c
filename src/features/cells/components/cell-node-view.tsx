import { NodeViewWrapper, type ReactNodeViewProps } from '@tiptap/react';
import { useMemo, useState } from 'react';
import { CELL_KIND_LABELS, isAnalysisKind, type CellKind } from '@shared/cells/kinds.ts';
import { resultFor, type CellOutput } from '@shared/cells/output.ts';
import type { Freshness } from '@shared/cells/resolve.ts';
import { Badge, type BadgeTone } from '@/components/ui/badge.tsx';
import { Button } from '@/components/ui/button.tsx';
import { cn } from '@/components/ui/cn.ts';
import { formatSeconds, useElapsed } from '@/components/ui/elapsed-progress.tsx';
import { toast } from '@/components/ui/toast.tsx';
import { NORM_AXIS } from '@shared/plots/branch-diagram-spec.ts';
import { useCellsRuntime } from '../runtime/cells-context.tsx';
import { BranchForm, EquilibriaForm, FoldMapForm, TrajectoryForm } from './analysis-forms.tsx';
import { CellErrorBoundary } from './cell-error-boundary.tsx';
import { BranchOutput, EquilibriaOutput, FoldMapOutput, TrajectoryOutput } from './cell-outputs.tsx';
import { unplacedProblems } from './field-problems.ts';
import { ModelCell } from './model-cell.tsx';
import { modelSummaries } from './model-ref.ts';

type Row = Record<string, unknown>;
const obj = (v: unknown): Row => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Row) : {});

type Status = { label: string; tone: BadgeTone };
function statusOf(
  freshness: Freshness | undefined,
  output: CellOutput | undefined,
  running: boolean,
  elapsed: number,
  runError?: string,
): Status {
  if (running) return { label: `running ${formatSeconds(elapsed)}`, tone: 'accent' };
  if (runError) return { label: 'run failed', tone: 'unstable' };
  if (freshness === 'invalid') return { label: 'input needs attention', tone: 'warning' };
  if (freshness === 'never-run' || !output) return { label: 'not run yet', tone: 'neutral' };
  if (freshness === 'stale') return { label: 'stale', tone: 'warning' };
  if (output.status === 'error') return { label: 'error', tone: 'unstable' };
  return { label: 'up to date', tone: 'success' };
}

function OutputStamp({ output, cached }: { output: CellOutput; cached: boolean }) {
  const at = new Date(output.computedAt);
  return (
    <p className="mt-3 border-t border-rule pt-2 text-[11px] text-ink-muted" data-testid="output-stamp">
      Computed {at.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })} · engine{' '}
      {output.engineVersion} · input{' '}
      <span className="figures" title={output.inputHash}>
        {output.inputHash.slice(0, 10)}
      </span>{' '}
      · {output.elapsedMs < 1000 ? `${Math.round(output.elapsedMs)} ms` : formatSeconds(output.elapsedMs)}
      {cached ? ' · from an earlier identical run' : ''}
    </p>
  );
}

function CellMenu({
  onMove,
  onDuplicate,
  onRemove,
}: {
  onMove: (d: 'up' | 'down') => void;
  onDuplicate: () => void;
  onRemove: () => void;
}) {
  const [open, setOpen] = useState(false);
  const item = 'block w-full rounded-sm px-3 py-1.5 text-left text-sm hover:bg-sunken';
  const act = (f: () => void) => () => {
    setOpen(false);
    f();
  };
  return (
    <div className="relative" onKeyDown={(e) => e.key === 'Escape' && setOpen(false)}>
      <button
        type="button"
        aria-label="Cell actions"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="h-8 w-8 rounded-sm text-lg leading-none text-ink-muted hover:bg-sunken hover:text-ink"
      >
        ⋯
      </button>
      {open && (
        <div
          role="menu"
          className="absolute right-0 z-30 mt-1 w-44 rounded-md border border-rule bg-surface p-1 shadow-xl"
        >
          <button type="button" role="menuitem" className={item} onClick={act(() => onMove('up'))}>
            Move up
          </button>
          <button type="button" role="menuitem" className={item} onClick={act(() => onMove('down'))}>
            Move down
          </button>
          <button type="button" role="menuitem" className={item} onClick={act(onDuplicate)}>
            Duplicate
          </button>
          <button type="button" role="menuitem" className={cn(item, 'text-unstable')} onClick={act(onRemove)}>
            Remove
          </button>
        </div>
      )}
    </div>
  );
}

/** A computation cell in the entry: a card with its kind, model, status and actions; the input form; the output. */
export function CellNodeView({
  node,
  updateAttributes,
  deleteNode,
  editor,
  getPos,
  selected,
}: ReactNodeViewProps) {
  const rt = useCellsRuntime();
  const id = String(node.attrs.id ?? '');
  const kind = node.attrs.kind as CellKind;
  const input = obj(node.attrs.input);
  const models = useMemo(() => modelSummaries(rt.cells), [rt.cells]);
  const model = models.find((m) => m.id === input.modelCellId);
  const output = rt.outputs[id];
  const run = rt.running[id];
  const elapsed = useElapsed(run?.startedAt);
  const freshness = rt.freshness[id];
  const problems = rt.problems[id];
  const editable = !rt.readOnly && editor.isEditable;
  const analysis = isAnalysisKind(kind);
  const status = analysis ? statusOf(freshness, output, !!run, elapsed, rt.runErrors[id]) : null;
  const onChange = (next: Row) => updateAttributes({ input: next });
  const pos = () => getPos() ?? -1;
  const variables = useMemo(() => model?.variables ?? [], [model]);

  const formProps = { input, onChange, model, models, problems };
  const task = obj(input.task);
  const view = obj(input.view);

  let body: React.ReactNode = null;
  if (kind === 'model') body = <ModelCell input={input} onChange={onChange} readOnly={!editable} />;
  let form: React.ReactNode = null;
  if (kind === 'equilibria') form = <EquilibriaForm {...formProps} />;
  if (kind === 'branch') form = <BranchForm {...formProps} />;
  if (kind === 'fold-map') form = <FoldMapForm {...formProps} cells={rt.cells} outputs={rt.outputs} />;
  if (kind === 'trajectory') form = <TrajectoryForm {...formProps} />;

  let result: React.ReactNode = null;
  if (output?.status === 'error' && output.error) {
    result = (
      <div role="alert" className="rounded-md border border-unstable/40 bg-unstable-soft px-3 py-2 text-sm">
        <p className="font-medium text-unstable">The engine could not run this cell.</p>
        <p className="mt-0.5 text-ink">
          {output.error.message}
          {output.error.path ? (
            <span className="ml-1 font-mono text-xs text-ink-muted">({output.error.path})</span>
          ) : null}
        </p>
      </div>
    );
  } else if (kind === 'equilibria') {
    const r = resultFor('equilibria', output);
    if (r) result = <EquilibriaOutput result={r} variables={variables} />;
  } else if (kind === 'branch') {
    const r = resultFor('branch', output);
    if (r)
      result = (
        <BranchOutput
          result={r}
          parameter={String(task.parameter ?? '')}
          yVariable={String(view.yVariable ?? variables[0] ?? NORM_AXIS)}
          variables={variables}
        />
      );
  } else if (kind === 'fold-map') {
    const r = resultFor('fold-map', output);
    const ps = Array.isArray(task.parameters) ? (task.parameters as string[]) : [];
    if (r && ps.length === 2) result = <FoldMapOutput result={r} parameters={[ps[0], ps[1]]} />;
  } else if (kind === 'trajectory') {
    const r = resultFor('trajectory', output);
    if (r)
      result = (
        <TrajectoryOutput
          result={r}
          variables={variables}
          phaseX={view.phaseX as string | undefined}
          phaseY={view.phaseY as string | undefined}
        />
      );
  }

  const placed = ['modelCellId', 'task'];
  const modelProblems = (problems ?? []).filter((p) => p.path === 'model' || p.path.startsWith('model.'));
  const otherProblems = unplacedProblems(problems, [...placed, 'model']);
  const canRun = analysis && editable && freshness !== 'invalid';

  return (
    <NodeViewWrapper
      data-cell-kind={kind}
      data-cell-id={id}
      data-status={status?.label.split(' ')[0] ?? 'model'}
      className={cn(
        'not-prose rounded-lg border bg-surface font-sans text-base shadow-sm',
        selected ? 'border-accent ring-2 ring-accent/40' : 'border-rule-strong/60',
      )}
    >
      <header
        className="flex flex-wrap items-center gap-2 rounded-t-lg border-b border-rule bg-sunken/60 px-3 py-2"
        contentEditable={false}
      >
        <span
          data-drag-handle
          className={cn('select-none text-ink-muted', editable && 'cursor-grab')}
          aria-hidden="true"
          title="Drag to move"
        >
          ⠿
        </span>
        <h3 className="text-sm font-semibold text-ink">{CELL_KIND_LABELS[kind] ?? kind}</h3>
        {kind === 'model' && <span className="text-sm text-ink-muted">{String(input.name ?? '')}</span>}
        {analysis && (
          <span className="text-sm text-ink-muted">{model ? `of ${model.name}` : 'no model chosen'}</span>
        )}
        {status && (
          <Badge tone={status.tone} className="ml-1">
            <span aria-live="polite">{status.label}</span>
          </Badge>
        )}
        <div className="ml-auto flex items-center gap-1">
          {analysis &&
            editable &&
            (run ? (
              <Button
                size="sm"
                variant="danger"
                onClick={() => {
                  rt.cancel(id);
                  toast.undoable(`${CELL_KIND_LABELS[kind] ?? 'Cell'} run cancelled`, () => rt.run(id), 'Run again');
                }}
              >
                Cancel
              </Button>
            ) : (
              <Button
                size="sm"
                variant={freshness === 'stale' || freshness === 'never-run' ? 'primary' : 'secondary'}
                disabled={!canRun}
                onClick={() => rt.run(id)}
                title={canRun ? undefined : 'Fix the input first'}
              >
                {output ? 'Run again' : 'Run'}
              </Button>
            ))}
          {editable && (
            <CellMenu
              onMove={(d) => {
                if (editor.commands.moveCell(pos(), d)) toast.undoable(`Cell moved ${d}`, () => editor.commands.undo());
              }}
              onDuplicate={() => editor.commands.duplicateCell(pos())}
              onRemove={() => {
                deleteNode();
                toast.undoable(`${CELL_KIND_LABELS[kind] ?? 'Cell'} cell removed`, () => editor.commands.undo());
              }}
            />
          )}
        </div>
      </header>
      <div className="px-4 py-3" contentEditable={false}>
        <CellErrorBoundary resetKey={JSON.stringify(node.attrs.input) + (output?.inputHash ?? '')}>
          {body}
          {form && editable && <div className="mb-3">{form}</div>}
          {analysis && !editable && model && (
            <p className="mb-2 text-xs text-ink-muted">Uses the model “{model.name}”.</p>
          )}
          {modelProblems.length > 0 && (
            <p className="mb-2 text-sm text-warning">
              The model “{model?.name}” has fields that need attention (
              {modelProblems[0].message.toLowerCase()}).
            </p>
          )}
          {otherProblems.map((p, i) => (
            <p key={i} className="mb-2 text-sm text-unstable">
              {p.message}
            </p>
          ))}
          {rt.runErrors[id] && (
            <p className="mb-2 text-sm text-unstable">
              The run did not finish: {rt.runErrors[id]} The previous output is kept.
            </p>
          )}
          <div className={cn(freshness === 'stale' && 'opacity-60 transition-opacity')}>{result}</div>
          {result && output?.status === 'ok' && rt.cellExtras && (
            <div className="mt-2 flex flex-wrap justify-end gap-2">{rt.cellExtras({ id, kind })}</div>
          )}
          {output && <OutputStamp output={output} cached={!!rt.cached[id]} />}
        </CellErrorBoundary>
      </div>
    </NodeViewWrapper>
  );
}
