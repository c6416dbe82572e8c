import type { TopLevelSpec } from 'vega-lite';
import { FIGURE_LIMITS } from '@shared/api/figures.ts';
import type { MeasurementRow } from '@shared/api/measurements.ts';
import type { ContinuationResult, FoldCurveResult, SimulateResult } from '@shared/engine/contract.ts';

/**
 * Vega-lite specifications for server-rendered figures: print colours on white, fixed size,
 * no interaction. (The client's interactive plot builders read the page's theme; these do not.)
 */
const INK = '#1f2933';
const STABILITY_COLOURS = { domain: ['stable', 'unstable', 'neutral'], range: ['#1d4ed8', '#b91c1c', '#6b7280'] };
const FONT = 'DejaVu Sans';

const config = {
  background: '#ffffff',
  font: FONT,
  view: { stroke: null },
  axis: { labelColor: INK, titleColor: INK, gridColor: '#e5e7eb', domainColor: INK, tickColor: INK, labelFontSize: 11, titleFontSize: 12 },
  legend: { labelColor: INK, titleColor: INK, orient: 'bottom' },
  title: { color: INK, fontSize: 13, anchor: 'start' },
} as const;

const size = { width: FIGURE_LIMITS.width, height: FIGURE_LIMITS.height };

export interface MeasurementOverlay {
  name: string;
  rows: MeasurementRow[];
}

/** Parameter against one state variable along the branch, by stability, folds and other events marked; measured data over it. */
export function branchFigureSpec(
  result: ContinuationResult,
  props: { parameter: string; variable: string; caption: string; measurements?: MeasurementOverlay[] },
): TopLevelSpec {
  const points = result.branch.points.map((p, i) => ({ i, parameter: p.parameter, y: p.state[props.variable] ?? null, stability: p.stability }));
  // Runs of equal stability share their boundary point, so the line has no gap.
  const lines: { i: number; run: number; parameter: number; y: number | null; stability: string }[] = [];
  let run = 0;
  points.forEach((p, k) => {
    if (k > 0 && p.stability !== points[k - 1].stability) {
      run += 1;
      lines.push({ ...points[k - 1], run, stability: p.stability });
    }
    lines.push({ ...p, run });
  });
  const events = result.branch.events.map((e) => ({ kind: e.kind, parameter: e.parameter, y: e.state[props.variable] ?? null }));
  const measured = (props.measurements ?? []).flatMap((m) =>
    m.rows.map((r) => ({ set: m.name, parameter: r.parameter, y: r.value, low: r.value - (r.errorLow ?? 0), high: r.value + (r.errorHigh ?? 0) })),
  );
  const x = { field: 'parameter', type: 'quantitative', title: props.parameter, scale: { zero: false } };
  const y = { field: 'y', type: 'quantitative', title: props.variable, scale: { zero: false } };
  const layers: object[] = [
    {
      data: { values: lines },
      mark: { type: 'line', strokeWidth: 2 },
      encoding: { x, y, detail: { field: 'run' }, order: { field: 'i' }, color: { field: 'stability', type: 'nominal', title: 'Stability', scale: STABILITY_COLOURS } },
    },
  ];
  if (events.length) {
    layers.push({
      data: { values: events },
      mark: { type: 'point', filled: true, size: 70, color: INK },
      encoding: { x, y, shape: { field: 'kind', type: 'nominal', title: 'Event' } },
    });
  }
  if (measured.length) {
    layers.push(
      { data: { values: measured }, mark: { type: 'rule', color: '#047857' }, encoding: { x, y: { ...y, field: 'low' }, y2: { field: 'high' } } },
      { data: { values: measured }, mark: { type: 'point', shape: 'diamond', filled: true, size: 40, color: '#047857' }, encoding: { x, y } },
    );
  }
  return { $schema: 'https://vega.github.io/schema/vega-lite/v6.json', ...size, config, title: props.caption || undefined, layer: layers } as TopLevelSpec;
}

/** The fold curve in the plane of two parameters, with cusps marked. */
export function foldMapFigureSpec(result: FoldCurveResult, props: { parameters: readonly [string, string]; caption: string }): TopLevelSpec {
  const [p1, p2] = props.parameters;
  const curve = result.curve.points.map((p, i) => ({ i, a: p.parameters[p1], b: p.parameters[p2] }));
  const cusps = result.curve.events.map((e) => ({ a: e.parameters[p1], b: e.parameters[p2] }));
  const x = { field: 'a', type: 'quantitative', title: p1, scale: { zero: false } };
  const y = { field: 'b', type: 'quantitative', title: p2, scale: { zero: false } };
  const layers: object[] = [{ data: { values: curve }, mark: { type: 'line', color: '#1d4ed8', strokeWidth: 2 }, encoding: { x, y, order: { field: 'i' } } }];
  if (cusps.length) layers.push({ data: { values: cusps }, mark: { type: 'point', shape: 'triangle-up', filled: true, size: 90, color: INK }, encoding: { x, y } });
  return { $schema: 'https://vega.github.io/schema/vega-lite/v6.json', ...size, config, title: props.caption || undefined, layer: layers } as TopLevelSpec;
}

/** Each state variable against time. */
export function trajectoryFigureSpec(result: SimulateResult, props: { caption: string }): TopLevelSpec {
  const { t, state } = result.trajectory;
  const values = Object.keys(state).flatMap((name) => t.map((time, i) => ({ time, value: state[name][i], variable: name })));
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...size,
    config,
    title: props.caption || undefined,
    data: { values },
    mark: { type: 'line', strokeWidth: 2 },
    encoding: {
      x: { field: 'time', type: 'quantitative', title: 't' },
      y: { field: 'value', type: 'quantitative', title: 'state', scale: { zero: false } },
      color: { field: 'variable', type: 'nominal', title: 'Variable' },
    },
  } as TopLevelSpec;
}
