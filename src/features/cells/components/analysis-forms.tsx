import type { FieldProblem } from '@shared/cells/inputs.ts';
import { resultFor, type CellOutputs } from '@shared/cells/output.ts';
import type { DocumentCell } from '@shared/editor/document.ts';
import { NORM_AXIS } from '@shared/plots/branch-diagram-spec.ts';
import { formatNumber } from '@shared/plots/plot-style.ts';
import { problemAt } from './field-problems.ts';
import { IntervalsRow, NumberField, SmallField, SmallSelect, ValuesRow } from './form-parts.tsx';
import type { ModelSummary } from './model-ref.ts';

type Row = Record<string, unknown>;
export type AnalysisFormProps = {
  input: Row;
  onChange: (next: Row) => void;
  model: ModelSummary | undefined;
  models: ModelSummary[];
  problems: FieldProblem[] | undefined;
};

const obj = (v: unknown): Row => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Row) : {});

function useTask(p: AnalysisFormProps) {
  const task = obj(p.input.task);
  const view = obj(p.input.view);
  return {
    task,
    view,
    setTask: (patch: Row) => p.onChange({ ...p.input, task: { ...task, ...patch } }),
    setView: (patch: Row) => p.onChange({ ...p.input, view: { ...view, ...patch } }),
    err: (path: string) => problemAt(p.problems, path),
  };
}

/** Which model cell of the entry an analysis cell uses, chosen by its name. */
export function ModelPicker({ input, onChange, models, problems }: AnalysisFormProps) {
  const id = typeof input.modelCellId === 'string' ? input.modelCellId : '';
  return (
    <SmallField label="Model" error={problemAt(problems, 'modelCellId')} className="w-64">
      <SmallSelect
        value={models.some((m) => m.id === id) ? id : ''}
        onChange={(e) => onChange({ ...input, modelCellId: e.target.value })}
      >
        <option value="">{models.length ? 'Choose a model cell…' : 'Add a model cell first'}</option>
        {models.map((m) => (
          <option key={m.id} value={m.id}>
            {m.name}
          </option>
        ))}
      </SmallSelect>
    </SmallField>
  );
}

function ParameterSelect({
  label,
  value,
  model,
  onValue,
  error,
}: {
  label: string;
  value: unknown;
  model: ModelSummary | undefined;
  onValue: (v: string) => void;
  error?: string;
}) {
  const names = model?.parameters.map((p) => p.name) ?? [];
  return (
    <SmallField label={label} error={error} className="w-40">
      <SmallSelect value={typeof value === 'string' ? value : ''} onChange={(e) => onValue(e.target.value)}>
        <option value="">Choose…</option>
        {names.map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </SmallSelect>
    </SmallField>
  );
}

const DIRECTION_LABELS = { both: 'both ways', increasing: 'increasing', decreasing: 'decreasing' } as const;

export function EquilibriaForm(p: AnalysisFormProps) {
  const { task, setTask, err } = useTask(p);
  return (
    <div className="flex flex-wrap items-start gap-x-6 gap-y-3">
      <ModelPicker {...p} />
      <NumberField
        className="w-32"
        label="Starting points"
        value={task.starts}
        onValue={(v) => setTask({ starts: v })}
        error={err('task.starts')}
      />
      <div className="basis-full">
        <span className="mb-1 block text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Search box
        </span>
        <IntervalsRow
          names={p.model?.variables ?? []}
          intervals={obj(task.box)}
          onIntervals={(box) => setTask({ box })}
          errorFor={(n) => err(`task.box.${n}`)}
          fallback={() => [-10, 10]}
        />
      </div>
    </div>
  );
}

export function BranchForm(p: AnalysisFormProps) {
  const { task, view, setTask, setView, err } = useTask(p);
  const bounds = obj(task.bounds);
  const axes = [...(p.model?.variables ?? []), NORM_AXIS];
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-start gap-x-5 gap-y-3">
        <ModelPicker {...p} />
        <ParameterSelect
          label="Parameter to vary"
          value={task.parameter}
          model={p.model}
          onValue={(v) => setTask({ parameter: v })}
          error={err('task.parameter')}
        />
        <NumberField
          className="w-28"
          label="from"
          value={bounds.min}
          onValue={(v) => setTask({ bounds: { ...bounds, min: v } })}
          error={err('task.bounds.min') ?? err('task.bounds')}
        />
        <NumberField
          className="w-28"
          label="to"
          value={bounds.max}
          onValue={(v) => setTask({ bounds: { ...bounds, max: v } })}
          error={err('task.bounds.max')}
        />
        <SmallField label="Follow" className="w-36">
          <SmallSelect
            value={typeof task.direction === 'string' ? task.direction : 'both'}
            onChange={(e) => setTask({ direction: e.target.value })}
          >
            {Object.entries(DIRECTION_LABELS).map(([k, l]) => (
              <option key={k} value={k}>
                {l}
              </option>
            ))}
          </SmallSelect>
        </SmallField>
        <NumberField
          className="w-28"
          label="At most points"
          value={task.maxPoints}
          onValue={(v) => setTask({ maxPoints: v })}
          error={err('task.maxPoints')}
        />
        <SmallField label="Vertical axis" className="w-32">
          <SmallSelect
            value={typeof view.yVariable === 'string' ? view.yVariable : (axes[0] ?? '')}
            onChange={(e) => setView({ yVariable: e.target.value })}
          >
            {axes.map((a) => (
              <option key={a} value={a}>
                {a === NORM_AXIS ? 'norm ‖x‖' : a}
              </option>
            ))}
          </SmallSelect>
        </SmallField>
      </div>
      <div>
        <span className="mb-1 block text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Start near (left empty: 0)
        </span>
        <ValuesRow
          names={p.model?.variables ?? []}
          values={obj(task.start)}
          onValues={(start) => setTask({ start })}
          errorFor={(n) => err(`task.start.${n}`)}
          optional
        />
      </div>
    </div>
  );
}

/** Fold events of the entry's branch cells that use the same model: good places to start a fold curve. */
function foldStarts(cells: readonly DocumentCell[], outputs: CellOutputs, modelCellId: unknown) {
  const out: { label: string; parameter: string; value: number; state: Record<string, number> }[] = [];
  for (const c of cells) {
    if (c.kind !== 'branch' || c.input.modelCellId !== modelCellId) continue;
    const r = resultFor('branch', outputs[c.id]);
    const parameter = String(obj(c.input.task).parameter ?? '');
    r?.branch.events.forEach((e) => {
      if (e.kind === 'fold')
        out.push({
          label: `fold at ${parameter} = ${formatNumber(e.parameter)}`,
          parameter,
          value: e.parameter,
          state: e.state,
        });
    });
  }
  return out;
}

export function FoldMapForm(p: AnalysisFormProps & { cells: readonly DocumentCell[]; outputs: CellOutputs }) {
  const { task, setTask, err } = useTask(p);
  const params = Array.isArray(task.parameters) ? (task.parameters as unknown[]) : ['', ''];
  const start = obj(task.start);
  const chosen = params.filter((x): x is string => typeof x === 'string' && x !== '');
  const setParam = (k: 0 | 1, v: string) => {
    const next = [...params];
    next[k] = v;
    const bounds = { ...obj(task.bounds) };
    const startParams = { ...obj(start.parameters) };
    const info = p.model?.parameters.find((q) => q.name === v);
    if (v && !bounds[v])
      bounds[v] = [
        (info?.value ?? 0) - Math.max(1, Math.abs(info?.value ?? 0)),
        (info?.value ?? 0) + Math.max(1, Math.abs(info?.value ?? 0)),
      ];
    if (v && startParams[v] === undefined) startParams[v] = info?.value ?? 0;
    setTask({ parameters: next, bounds, start: { ...start, parameters: startParams } });
  };
  const folds = foldStarts(p.cells, p.outputs, p.input.modelCellId);
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-start gap-x-5 gap-y-3">
        <ModelPicker {...p} />
        <ParameterSelect
          label="Horizontal parameter"
          value={params[0]}
          model={p.model}
          onValue={(v) => setParam(0, v)}
          error={err('task.parameters[0]') ?? err('task.parameters')}
        />
        <ParameterSelect
          label="Vertical parameter"
          value={params[1]}
          model={p.model}
          onValue={(v) => setParam(1, v)}
          error={err('task.parameters[1]')}
        />
        <NumberField
          className="w-28"
          label="At most points"
          value={task.maxPoints}
          onValue={(v) => setTask({ maxPoints: v })}
          error={err('task.maxPoints')}
        />
      </div>
      <div>
        <span className="mb-1 block text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Range of each parameter
        </span>
        <IntervalsRow
          names={chosen}
          intervals={obj(task.bounds)}
          onIntervals={(bounds) => setTask({ bounds })}
          errorFor={(n) => err(`task.bounds.${n}`)}
          fallback={() => [0, 1]}
        />
      </div>
      <div>
        <div className="mb-1 flex flex-wrap items-center gap-3">
          <span className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
            Start near a fold
          </span>
          {folds.length > 0 && (
            <div className="w-72">
              <SmallSelect
                aria-label="Start from a fold found by a branch cell"
                value=""
                onChange={(e) => {
                  const f = folds[Number(e.target.value)];
                  if (!f) return;
                  const startParams = { ...obj(start.parameters), [f.parameter]: f.value };
                  setTask({ start: { parameters: startParams, state: f.state } });
                }}
              >
                <option value="">Take a fold from a branch cell…</option>
                {folds.map((f, i) => (
                  <option key={i} value={i}>
                    {f.label}
                  </option>
                ))}
              </SmallSelect>
            </div>
          )}
        </div>
        <div className="flex flex-wrap gap-4">
          <ValuesRow
            names={chosen}
            values={obj(start.parameters)}
            onValues={(v) => setTask({ start: { ...start, parameters: v } })}
            errorFor={(n) => err(`task.start.parameters.${n}`)}
          />
          <ValuesRow
            names={p.model?.variables ?? []}
            values={obj(start.state)}
            onValues={(v) => setTask({ start: { ...start, state: v } })}
            errorFor={(n) => err(`task.start.state.${n}`)}
            optional
          />
        </div>
      </div>
    </div>
  );
}

export function TrajectoryForm(p: AnalysisFormProps) {
  const { task, view, setTask, setView, err } = useTask(p);
  const time = obj(task.time);
  const vars = p.model?.variables ?? [];
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-start gap-x-5 gap-y-3">
        <ModelPicker {...p} />
        <NumberField
          className="w-24"
          label="from time"
          value={time.start}
          onValue={(v) => setTask({ time: { ...time, start: v } })}
          error={err('task.time.start')}
        />
        <NumberField
          className="w-24"
          label="to time"
          value={time.end}
          onValue={(v) => setTask({ time: { ...time, end: v } })}
          error={err('task.time.end') ?? err('task.time')}
        />
        <NumberField
          className="w-24"
          label="Samples"
          value={time.samples}
          onValue={(v) => setTask({ time: { ...time, samples: v } })}
          error={err('task.time.samples')}
        />
        {vars.length >= 2 && (
          <>
            <SmallField label="Phase plane across" className="w-28">
              <SmallSelect
                value={typeof view.phaseX === 'string' ? view.phaseX : vars[0]}
                onChange={(e) => setView({ phaseX: e.target.value })}
              >
                {vars.map((v) => (
                  <option key={v}>{v}</option>
                ))}
              </SmallSelect>
            </SmallField>
            <SmallField label="and up" className="w-28">
              <SmallSelect
                value={typeof view.phaseY === 'string' ? view.phaseY : vars[1]}
                onChange={(e) => setView({ phaseY: e.target.value })}
              >
                {vars.map((v) => (
                  <option key={v}>{v}</option>
                ))}
              </SmallSelect>
            </SmallField>
          </>
        )}
      </div>
      <div>
        <span className="mb-1 block text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Initial values (left empty: 0)
        </span>
        <ValuesRow
          names={vars}
          values={obj(task.initial)}
          onValues={(initial) => setTask({ initial })}
          errorFor={(n) => err(`task.initial.${n}`)}
          optional
        />
      </div>
    </div>
  );
}
