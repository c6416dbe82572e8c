import { useEffect, useMemo, useState } from 'react';
import {
  checkCellInput,
  toEngineModel,
  type FieldProblem,
  type ModelCellInput,
} from '@shared/cells/inputs.ts';
import { cn } from '@/components/ui/cn.ts';
import { controlClass } from '@/components/ui/input.tsx';
import { KatexFormula } from '@/components/ui/katex-formula.tsx';
import { expressionTex, symbolTex } from './expression-tex.ts';
import { problemAt } from './field-problems.ts';
import { isBlankModel, MODEL_EXAMPLES } from './model-examples.ts';
import { NumberInput } from './number-input.tsx';
import { useCellsRuntime } from '../runtime/cells-context.tsx';

type Row = Record<string, unknown>;
const rows = (v: unknown): Row[] => (Array.isArray(v) ? (v as Row[]) : []);
const str = (v: unknown) => (typeof v === 'string' ? v : '');

/** The model's equations typeset, one line each: ẋ = f(x, p), then definitions and parameter values. */
function EquationsPreview({ input }: { input: Row }) {
  const [tex, setTex] = useState<string | null>(null);
  const variables = rows(input.variables);
  const definitions = rows(input.definitions);
  const parameters = rows(input.parameters);
  const key = JSON.stringify([variables, definitions, parameters]);
  useEffect(() => {
    let alive = true;
    void (async () => {
      const lines: string[] = [];
      for (const d of definitions) {
        const t = await expressionTex(str(d.expression));
        if (str(d.name)) lines.push(`${symbolTex(str(d.name))} &= ${t ?? '\\text{?}'}`);
      }
      for (const v of variables) {
        const t = await expressionTex(str(v.rhs));
        if (str(v.name)) lines.push(`\\dot{${symbolTex(str(v.name))}} &= ${t ?? '\\text{?}'}`);
      }
      if (alive) setTex(lines.length ? `\\begin{aligned}${lines.join('\\\\')}\\end{aligned}` : null);
    })();
    return () => {
      alive = false;
    };
    // `key` stands for the three arrays' contents.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);
  const params = parameters
    .filter((p) => str(p.name))
    .map(
      (p) =>
        `${symbolTex(str(p.name))} = ${typeof p.value === 'number' ? p.value : '\\text{?}'}${str(p.unit) ? `\\,\\mathrm{${str(p.unit).replace(/[{}\\]/g, '')}}` : ''}`,
    )
    .join(',\\quad ');
  if (!tex)
    return (
      <p className="py-3 text-center text-sm text-ink-muted">The equations appear here as you write them.</p>
    );
  return (
    <div className="py-2" data-testid="model-equations">
      <KatexFormula latex={tex} display />
      {params && <KatexFormula latex={params} display className="mt-1 text-sm text-ink-muted" />}
    </div>
  );
}

/** The empty model's offer: write the equations below, or start from a small working example in one click. */
function ExamplePicker({ onPick }: { onPick: (input: Row) => void }) {
  return (
    <div className="rounded-md border border-dashed border-rule-strong bg-paper px-4 py-3" role="group" aria-label="Start from an example">
      <p className="text-sm text-ink">Write the equations below, or start from an example and change it:</p>
      <div className="mt-2 flex flex-wrap gap-2">
        {MODEL_EXAMPLES.map((ex) => (
          <button
            key={ex.key}
            type="button"
            title={ex.description}
            onClick={() => onPick(ex.input as Row)}
            className="rounded-md border border-accent/40 bg-surface px-3 py-1.5 text-left text-sm hover:bg-accent-soft focus-visible:outline-2 focus-visible:outline-accent"
          >
            <span className="block font-medium text-accent">{ex.label}</span>
            <span className="block text-xs text-ink-muted">{ex.description}</span>
          </button>
        ))}
      </div>
    </div>
  );
}

function TextCell({
  value,
  onValue,
  error,
  placeholder,
  label,
  mono = true,
  className,
}: {
  value: unknown;
  onValue: (v: string) => void;
  error?: string;
  placeholder?: string;
  label: string;
  mono?: boolean;
  className?: string;
}) {
  return (
    <div className={cn('min-w-0', className)}>
      <input
        aria-label={label}
        aria-invalid={error ? true : undefined}
        value={str(value)}
        placeholder={placeholder}
        spellCheck={false}
        autoComplete="off"
        onChange={(e) => onValue(e.target.value)}
        className={cn(controlClass, 'h-8 w-full min-w-0 px-2 text-sm', mono && 'font-mono')}
      />
      {error && <p className="mt-0.5 text-xs font-medium text-unstable">{error}</p>}
    </div>
  );
}

function RemoveButton({ label, onClick }: { label: string; onClick: () => void }) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      onClick={onClick}
      className="h-8 w-8 rounded-sm text-ink-muted hover:bg-unstable-soft hover:text-unstable"
    >
      ×
    </button>
  );
}

function SectionHead({ title, onAdd, addLabel }: { title: string; onAdd?: () => void; addLabel: string }) {
  return (
    <div className="mt-4 mb-1.5 flex items-center justify-between">
      <h4 className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{title}</h4>
      {onAdd && (
        <button
          type="button"
          onClick={onAdd}
          className="inline-flex min-h-6 items-center rounded-sm px-2 text-xs font-medium text-accent hover:bg-accent-soft"
        >
          + {addLabel}
        </button>
      )}
    </div>
  );
}

/**
 * The model cell: name, state variables with right-hand sides, parameters with values, and
 * definitions. Each field is checked as it is typed — first its shape, then (after a pause) by
 * the engine's parser — and the message sits under the field.
 */
export function ModelCell({
  input,
  onChange,
  readOnly,
}: {
  input: Row;
  onChange: (next: Row) => void;
  readOnly: boolean;
}) {
  const { validateModel } = useCellsRuntime();
  const local = useMemo(() => checkCellInput('model', input), [input]);
  // The engine's answer, remembered with the model it was about (so a stale answer never shows).
  const [engineCheck, setEngineCheck] = useState<{ model: string; problems: FieldProblem[] } | null>(null);
  const modelJson = local.ok ? JSON.stringify(toEngineModel(local.value)) : null;
  const engineProblems = engineCheck && engineCheck.model === modelJson ? engineCheck.problems : [];

  useEffect(() => {
    if (!modelJson || readOnly) return;
    const controller = new AbortController();
    const timer = setTimeout(() => {
      validateModel(JSON.parse(modelJson), controller.signal)
        .then((errs) =>
          setEngineCheck({
            model: modelJson,
            problems: errs.map((e) => ({ ...e, path: e.path.replace(/^model\./, '') })),
          }),
        )
        .catch(() => undefined);
    }, 450);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [modelJson, validateModel, readOnly]);

  const problems = local.ok ? engineProblems : local.problems;
  const err = (path: string) => problemAt(problems, path);
  const set = (patch: Row) => onChange({ ...input, ...patch });
  const setRow = (list: 'variables' | 'parameters' | 'definitions', i: number, patch: Row) =>
    set({ [list]: rows(input[list]).map((r, k) => (k === i ? { ...r, ...patch } : r)) });
  const addRow = (list: 'variables' | 'parameters' | 'definitions', row: Row) =>
    set({ [list]: [...rows(input[list]), row] });
  const removeRow = (list: 'variables' | 'parameters' | 'definitions', i: number) =>
    set({ [list]: rows(input[list]).filter((_, k) => k !== i) });

  const typed = input as ModelCellInput;
  return (
    <div>
      {!readOnly && isBlankModel(input) ? <ExamplePicker onPick={(example) => onChange({ ...example })} /> : <EquationsPreview input={input} />}
      {!readOnly && (
        <div className="mt-2 border-t border-rule pt-3">
          <TextCell
            className="max-w-lg"
            label="Model name"
            value={typed.name}
            onValue={(v) => set({ name: v })}
            error={err('name')}
            placeholder="Name, e.g. Stirred tank, first-order reaction"
            mono={false}
          />
          {err('variables') && !err('variables[0]') && (
            <p className="mt-1 text-xs font-medium text-unstable">{err('variables')}</p>
          )}

          <SectionHead
            title="State variables and right-hand sides"
            addLabel="variable"
            onAdd={() => addRow('variables', { name: '', rhs: '' })}
          />
          <div className="space-y-1.5">
            {rows(input.variables).map((v, i) => (
              <div key={i} className="grid grid-cols-[7rem_auto_1fr_6rem_2rem] items-start gap-2">
                <TextCell
                  label={`Variable ${i + 1} name`}
                  value={v.name}
                  onValue={(s) => setRow('variables', i, { name: s })}
                  error={err(`variables[${i}].name`)}
                  placeholder="x"
                />
                <span className="pt-1.5 font-serif text-sm text-ink-muted">′ =</span>
                <TextCell
                  label={`Right-hand side of ${str(v.name) || `variable ${i + 1}`}`}
                  value={v.rhs}
                  onValue={(s) => setRow('variables', i, { rhs: s })}
                  error={err(`variables[${i}].rhs`)}
                  placeholder="mu - x^2"
                />
                <TextCell
                  label={`Unit of ${str(v.name) || `variable ${i + 1}`}`}
                  value={v.unit}
                  onValue={(s) => setRow('variables', i, { unit: s || undefined })}
                  error={err(`variables[${i}].unit`)}
                  placeholder="unit"
                  mono={false}
                />
                <RemoveButton
                  label={`Remove variable ${str(v.name) || i + 1}`}
                  onClick={() => removeRow('variables', i)}
                />
              </div>
            ))}
          </div>

          <SectionHead
            title="Parameters"
            addLabel="parameter"
            onAdd={() => addRow('parameters', { name: '', value: 0 })}
          />
          <div className="space-y-1.5">
            {rows(input.parameters).map((p, i) => (
              <div key={i} className="grid grid-cols-[7rem_auto_8rem_6rem_1fr_2rem] items-start gap-2">
                <TextCell
                  label={`Parameter ${i + 1} name`}
                  value={p.name}
                  onValue={(s) => setRow('parameters', i, { name: s })}
                  error={err(`parameters[${i}].name`)}
                  placeholder="mu"
                />
                <span className="pt-1.5 font-serif text-sm text-ink-muted">=</span>
                <div className="min-w-0">
                  <NumberInput
                    aria-label={`Value of ${str(p.name) || `parameter ${i + 1}`}`}
                    aria-invalid={err(`parameters[${i}].value`) ? true : undefined}
                    value={p.value}
                    onValue={(n) => setRow('parameters', i, { value: n })}
                  />
                  {err(`parameters[${i}].value`) && (
                    <p className="mt-0.5 text-xs font-medium text-unstable">
                      {err(`parameters[${i}].value`)}
                    </p>
                  )}
                </div>
                <TextCell
                  label={`Unit of ${str(p.name) || `parameter ${i + 1}`}`}
                  value={p.unit}
                  onValue={(s) => setRow('parameters', i, { unit: s || undefined })}
                  placeholder="unit"
                  mono={false}
                />
                <TextCell
                  label={`Note on ${str(p.name) || `parameter ${i + 1}`}`}
                  value={p.note}
                  onValue={(s) => setRow('parameters', i, { note: s || undefined })}
                  placeholder="note"
                  mono={false}
                />
                <RemoveButton
                  label={`Remove parameter ${str(p.name) || i + 1}`}
                  onClick={() => removeRow('parameters', i)}
                />
              </div>
            ))}
          </div>

          <SectionHead
            title="Definitions (used in the right-hand sides)"
            addLabel="definition"
            onAdd={() => addRow('definitions', { name: '', expression: '' })}
          />
          <div className="space-y-1.5">
            {rows(input.definitions).map((d, i) => (
              <div key={i} className="grid grid-cols-[7rem_auto_1fr_2rem] items-start gap-2">
                <TextCell
                  label={`Definition ${i + 1} name`}
                  value={d.name}
                  onValue={(s) => setRow('definitions', i, { name: s })}
                  error={err(`definitions[${i}].name`)}
                  placeholder="r"
                />
                <span className="pt-1.5 font-serif text-sm text-ink-muted">=</span>
                <TextCell
                  label={`Expression of ${str(d.name) || `definition ${i + 1}`}`}
                  value={d.expression}
                  onValue={(s) => setRow('definitions', i, { expression: s })}
                  error={err(`definitions[${i}].expression`)}
                  placeholder="k*exp(-E/T)"
                />
                <RemoveButton
                  label={`Remove definition ${str(d.name) || i + 1}`}
                  onClick={() => removeRow('definitions', i)}
                />
              </div>
            ))}
          </div>
          {problems.length > 0 && (
            <p role="status" className="mt-3 text-xs text-ink-muted">
              {problems.length === 1
                ? 'One field needs attention'
                : `${problems.length} fields need attention`}{' '}
              before cells can use this model.
            </p>
          )}
        </div>
      )}
      {readOnly && rows(input.parameters).some((p) => str(p.note)) && (
        <ul className="mt-2 space-y-0.5 text-xs text-ink-muted">
          {rows(input.parameters)
            .filter((p) => str(p.note))
            .map((p, i) => (
              <li key={i}>
                <span className="font-mono">{str(p.name)}</span>: {str(p.note)}
              </li>
            ))}
        </ul>
      )}
    </div>
  );
}
