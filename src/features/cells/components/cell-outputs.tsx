import { useMemo, useRef, useState } from 'react';
import type {
  ContinuationResult,
  EquilibriaResult,
  FoldCurveResult,
  SimulateResult,
  Stability,
} from '@shared/engine/contract.ts';
import { Badge } from '@/components/ui/badge.tsx';
import { cn } from '@/components/ui/cn.ts';
import { branchDiagramSpec, EVENT_NAMES, NORM_AXIS } from '@shared/plots/branch-diagram-spec.ts';
import { foldMapSpec } from '@shared/plots/fold-map-spec.ts';
import { formatEigenvalues, formatNumber } from '@shared/plots/plot-style.ts';
import { readPlotPalette } from '@/lib/plot-palette.ts';
import { phasePlaneSpec, timeSeriesSpec } from '@shared/plots/trajectory-spec.ts';
import { LazyPlot } from './lazy-plot.tsx';

const STOP_REASON_TEXT: Record<string, string> = {
  bounds: 'reached the end of the parameter range',
  'max-points': 'reached the most points allowed',
  closed: 'closed on itself',
  'step-too-small': 'the step became too small (a sharp turn or a singular point)',
  'time-limit': 'ran out of time',
  'start-not-converged': 'the starting point did not converge to an equilibrium',
  completed: 'all starting points tried',
  end: 'reached the final time',
  'not-finite': 'the solution left the range of numbers',
};

export function StabilityBadge({ stability }: { stability: Stability }) {
  return (
    <Badge tone={stability === 'stable' ? 'stable' : stability === 'unstable' ? 'unstable' : 'warning'}>
      {stability}
    </Badge>
  );
}

function StopNote({ reason, atStart }: { reason: string; atStart?: string }) {
  return (
    <p className="mt-2 text-xs text-ink-muted">
      Stopped: {STOP_REASON_TEXT[reason] ?? reason}
      {atStart ? `; at the other end: ${STOP_REASON_TEXT[atStart] ?? atStart}` : ''}.
    </p>
  );
}

const th = 'px-2 py-1.5 text-left text-xs font-semibold text-ink-muted';
const td = 'px-2 py-1.5 align-top';

export function EquilibriaOutput({ result, variables }: { result: EquilibriaResult; variables: string[] }) {
  const names = variables.length ? variables : Object.keys(result.equilibria[0]?.state ?? {});
  if (result.equilibria.length === 0) {
    return (
      <p className="text-sm text-ink-muted">
        No equilibrium found in the box ({result.starts.tried} starting points tried).
      </p>
    );
  }
  return (
    <div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <caption className="mb-1 text-left text-xs text-ink-muted">
            {result.equilibria.length} equilibri{result.equilibria.length === 1 ? 'um' : 'a'} ·{' '}
            {result.starts.converged} of {result.starts.tried} starting points converged
          </caption>
          <thead className="border-b border-rule-strong">
            <tr>
              <th className={th}>#</th>
              {names.map((n) => (
                <th key={n} className={cn(th, 'font-mono')}>
                  {n}
                </th>
              ))}
              <th className={th}>eigenvalues</th>
              <th className={th}>stability</th>
              <th className={th} title="Number of eigenvalues with positive real part">
                unstable directions
              </th>
            </tr>
          </thead>
          <tbody>
            {result.equilibria.map((e, i) => (
              <tr key={i} className="border-b border-rule last:border-0">
                <td className={cn(td, 'text-ink-muted')}>{i + 1}</td>
                {names.map((n) => (
                  <td key={n} className={cn(td, 'figures')}>
                    {formatNumber(e.state[n])}
                  </td>
                ))}
                <td className={cn(td, 'figures text-xs')}>{formatEigenvalues(e.eigenvalues)}</td>
                <td className={td}>
                  <StabilityBadge stability={e.stability} />
                </td>
                <td className={cn(td, 'figures')}>{e.unstableDimension}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <StopNote reason={result.stopReason} />
    </div>
  );
}

function stabilityChange(result: ContinuationResult, after: number): string {
  const pts = result.branch.points;
  const before = pts[after]?.stability;
  const next = pts[after + 1]?.stability;
  if (!before || !next) return '—';
  return before === next ? `${before} on both sides` : `${before} → ${next}`;
}

export function BranchOutput({
  result,
  parameter,
  yVariable,
  variables,
}: {
  result: ContinuationResult;
  parameter: string;
  yVariable: string;
  variables: string[];
}) {
  const [selected, setSelected] = useState<number | null>(null);
  const plotRef = useRef<HTMLDivElement>(null);
  const y =
    yVariable === NORM_AXIS || variables.includes(yVariable) ? yVariable : (variables[0] ?? NORM_AXIS);
  const spec = useMemo(
    () =>
      branchDiagramSpec(result, {
        parameter,
        yVariable: y,
        variables,
        palette: readPlotPalette(),
        selectedEvent: selected,
      }),
    [result, parameter, y, variables, selected],
  );
  const select = (i: number) => {
    setSelected(i);
    plotRef.current?.scrollIntoView({ block: 'nearest', behavior: 'smooth' });
  };
  const events = result.branch.events;
  return (
    <div>
      <div ref={plotRef}>
        <LazyPlot
          spec={spec}
          label={`Branch of equilibria: ${y} against ${parameter}`}
          onClickDatum={(d) => typeof d.index === 'number' && 'kind' in d && setSelected(d.index)}
        />
      </div>
      <p className="mt-1 text-xs text-ink-muted">
        Solid: stable · dashed: unstable · dotted grey near each fold: the normal-form prediction x* ±
        v·√(−2a(μ−μ*)/b)
        {variables.length === 1 && y === variables[0] ? ` · background: where ${y}′ > 0 and < 0` : ''}.{' '}
        {result.branch.points.length} points.
      </p>
      <StopNote reason={result.branch.stopReason} atStart={result.branch.stopReasonAtStart} />
      {events.length > 0 ? (
        <div className="mt-3 overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="mb-1 text-left text-xs font-semibold tracking-wide text-ink-muted uppercase">
              Events along the branch
            </caption>
            <thead className="border-b border-rule-strong">
              <tr>
                <th className={th}>kind</th>
                <th className={cn(th, 'font-mono')}>{parameter}</th>
                <th className={th}>state</th>
                <th className={th}>a = w·f_μ</th>
                <th className={th}>b = w·D²f(v,v)</th>
                <th className={th}>pair of equilibria</th>
                <th className={th}>stability</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e, i) => (
                <tr
                  key={i}
                  data-selected={selected === i ? 'true' : undefined}
                  className={cn(
                    'cursor-pointer border-b border-rule last:border-0 hover:bg-sunken',
                    selected === i && 'bg-accent-soft',
                  )}
                  onClick={() => select(i)}
                >
                  <td className={td}>
                    <button
                      type="button"
                      className="inline-flex min-h-6 items-center font-medium text-accent underline-offset-2 hover:underline"
                      onClick={() => select(i)}
                    >
                      {EVENT_NAMES[e.kind]}
                    </button>
                    {e.kind === 'fold' && !e.normalForm.nondegenerate && (
                      <span className="ml-1 text-xs text-warning">(degenerate)</span>
                    )}
                  </td>
                  <td className={cn(td, 'figures')}>{formatNumber(e.parameter)}</td>
                  <td className={cn(td, 'figures text-xs')}>
                    {Object.entries(e.state)
                      .map(([k, v]) => `${k} = ${formatNumber(v)}`)
                      .join(', ')}
                  </td>
                  <td className={cn(td, 'figures')}>
                    {e.kind === 'fold' ? formatNumber(e.normalForm.a) : '—'}
                  </td>
                  <td className={cn(td, 'figures')}>
                    {e.kind === 'fold' ? formatNumber(e.normalForm.b) : '—'}
                  </td>
                  <td className={td}>
                    {e.kind === 'fold'
                      ? `${parameter} ${e.normalForm.equilibriaSide === 'above' ? '>' : '<'} ${formatNumber(e.parameter)}`
                      : e.kind === 'hopf'
                        ? `periodic orbits, ${e.criticality} (ω = ${formatNumber(e.frequency)})`
                        : `branches cross (${e.type})`}
                  </td>
                  <td className={cn(td, 'text-xs')}>{stabilityChange(result, e.after)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="mt-2 text-sm text-ink-muted">No folds or other events on this stretch of the branch.</p>
      )}
    </div>
  );
}

export function FoldMapOutput({
  result,
  parameters,
}: {
  result: FoldCurveResult;
  parameters: [string, string];
}) {
  const spec = useMemo(
    () => foldMapSpec(result, parameters, { palette: readPlotPalette() }),
    [result, parameters],
  );
  const cusps = result.curve.events;
  return (
    <div>
      <LazyPlot spec={spec} label={`Fold curve in the plane of ${parameters[0]} and ${parameters[1]}`} />
      <p className="mt-1 text-xs text-ink-muted">
        Line: parameter values where a fold occurs · shaded: inside the fold curve, where two stable states
        coexist · triangles: cusps. {result.curve.points.length} points.
      </p>
      <StopNote reason={result.curve.stopReason} atStart={result.curve.stopReasonAtStart} />
      {cusps.length > 0 && (
        <ul className="mt-2 text-sm">
          {cusps.map((c, i) => (
            <li key={i} className="figures">
              cusp at {parameters.map((p) => `${p} = ${formatNumber(c.parameters[p])}`).join(', ')}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

export function TrajectoryOutput({
  result,
  variables,
  phaseX,
  phaseY,
}: {
  result: SimulateResult;
  variables: string[];
  phaseX?: string;
  phaseY?: string;
}) {
  const names = variables.length ? variables : Object.keys(result.trajectory.state);
  const palette = useMemo(() => readPlotPalette(), []);
  const series = useMemo(
    () => timeSeriesSpec(result, names, { palette, height: 240 }),
    [result, names, palette],
  );
  const px = phaseX && names.includes(phaseX) ? phaseX : names[0];
  const py = phaseY && names.includes(phaseY) && phaseY !== px ? phaseY : names.find((n) => n !== px);
  const phase = useMemo(
    () => (py ? phasePlaneSpec(result, px, py, { palette, height: 240 }) : null),
    [result, px, py, palette],
  );
  return (
    <div>
      <div className={cn('grid gap-4', phase && 'md:grid-cols-2')}>
        <LazyPlot spec={series} label="Time series" height={240} />
        {phase && <LazyPlot spec={phase} label={`Phase plane: ${py} against ${px}`} height={240} />}
      </div>
      <StopNote reason={result.stopReason} />
    </div>
  );
}
