import type { TopLevelSpec } from 'vega-lite';
import type { MeasurementRow } from '@shared/api/measurements.ts';
import type {
  BranchEvent,
  BranchPoint,
  ContinuationResult,
  FoldEvent,
  Stability,
  Values,
} from '@shared/engine/contract.ts';
import {
  formatEigenvalues,
  formatNumber,
  hoverLayer,
  labelFont,
  layeredPlot,
  paddedRange,
  quantitativeChannel,
  type PlotPalette,
} from './plot-style.ts';
import { levelCrossings } from './level-crossings.ts';
import { STABILITY_LABEL, stabilityColor, stabilityScales } from './stability-style.ts';

/** What the vertical axis shows: one state variable, or the Euclidean norm of the state. */
export const NORM_AXIS = '‖x‖';

export function projectState(state: Values, yVariable: string): number {
  if (yVariable === NORM_AXIS) {
    let s = 0;
    for (const k of Object.keys(state)) s += state[k] * state[k];
    return Math.sqrt(s);
  }
  return state[yVariable] ?? NaN;
}

export interface BranchSegment {
  /** Index of the segment along the branch (0, 1, …). */
  index: number;
  stability: Stability;
  points: { parameter: number; y: number; pointIndex: number }[];
}

/**
 * Split the branch into runs of equal stability. Consecutive runs share their boundary point so
 * that the drawn line has no gap where stability changes (the change lies between those points).
 */
export function splitByStability(points: readonly BranchPoint[], yVariable: string): BranchSegment[] {
  const segments: BranchSegment[] = [];
  let current: BranchSegment | null = null;
  points.forEach((p, i) => {
    const entry = { parameter: p.parameter, y: projectState(p.state, yVariable), pointIndex: i };
    if (!current || current.stability !== p.stability) {
      const prev: BranchSegment | null = current;
      current = { index: segments.length, stability: p.stability, points: [] };
      if (prev) {
        const last = prev.points[prev.points.length - 1];
        current.points.push(last);
      }
      segments.push(current);
    }
    current.points.push(entry);
  });
  return segments;
}

export interface PredictionPoint {
  event: number;
  /** +1 or −1: which of the two equilibria born at the fold. */
  sign: 1 | -1;
  parameter: number;
  y: number;
}

/**
 * The fold's normal-form prediction x(μ) ≈ x* ± v·sqrt(−2a(μ−μ*)/b), drawn on the side of μ*
 * where the pair of equilibria exists (`equilibriaSide`: "above" means μ > μ*), for |μ−μ*| up
 * to `span`. Sample spacing grows quadratically away from the fold, where the square root bends
 * most. Folds whose normal form is degenerate (a or b ≈ 0) get no prediction.
 */
export function foldPrediction(
  event: FoldEvent,
  eventIndex: number,
  yVariable: string,
  span: number,
  samples = 24,
): PredictionPoint[] {
  const { a, b, nullVector: v, equilibriaSide, nondegenerate } = event.normalForm;
  if (!nondegenerate || b === 0 || !(span > 0)) return [];
  const dir = equilibriaSide === 'above' ? 1 : -1;
  const out: PredictionPoint[] = [];
  for (const sign of [1, -1] as const) {
    for (let k = 0; k <= samples; k++) {
      const delta = dir * span * (k / samples) ** 2;
      const radicand = (-2 * a * delta) / b;
      const r = Math.sqrt(Math.max(0, radicand));
      const state: Values = {};
      for (const name of Object.keys(event.state))
        state[name] = event.state[name] + sign * (v[name] ?? 0) * r;
      out.push({
        event: eventIndex,
        sign,
        parameter: event.parameter + delta,
        y: projectState(state, yVariable),
      });
    }
  }
  return out;
}

export interface FlowCell {
  parameter: number;
  parameter2: number;
  y: number;
  y2: number;
  /** Sign of x' in this band. */
  sign: 'increasing' | 'decreasing';
}

/**
 * For a one-variable model, the sign of x' = f(x, μ) on each phase line μ = const, from the
 * branch alone (no extra evaluations of f).
 *
 * Reasoning: at fixed μ, f is continuous in x and vanishes only at equilibria, so its sign is
 * constant between neighbouring equilibria. A stable equilibrium of a one-variable model has
 * f'(x*) < 0: f > 0 just below it and f < 0 just above. An unstable one has f'(x*) > 0: f < 0
 * below, f > 0 above. So each band's sign follows from the stability of the equilibrium bounding
 * it. A band between two equilibria gets a sign only when both ends agree (they always do when
 * every equilibrium at that μ lies on the computed branch; disagreement reveals an equilibrium
 * the branch did not reach, and the band is left blank). Bands above the highest and below the
 * lowest equilibrium reach the plot's edge. Columns where the branch has no point are left blank.
 */
export function flowBands(
  points: readonly BranchPoint[],
  variable: string,
  yDomain: [number, number],
  columns = 90,
): FlowCell[] {
  if (points.length < 2) return [];
  const mus = points.map((p) => p.parameter);
  const lo = Math.min(...mus);
  const hi = Math.max(...mus);
  if (!(hi > lo)) return [];
  const width = (hi - lo) / columns;
  const out: FlowCell[] = [];
  for (let c = 0; c < columns; c++) {
    const mu = lo + (c + 0.5) * width;
    const crossings = levelCrossings(mus, mu).map(({ i, t }) => {
      const p = points[i];
      const q = points[i + 1];
      return {
        x: p.state[variable] + t * (q.state[variable] - p.state[variable]),
        stability: t < 0.5 ? p.stability : q.stability,
      };
    });
    if (crossings.length === 0) continue;
    crossings.sort((m, n) => m.x - n.x);
    const below = (s: Stability) => (s === 'stable' ? 1 : s === 'unstable' ? -1 : 0);
    const above = (s: Stability) => -below(s);
    const bands: { y: number; y2: number; sign: number }[] = [];
    bands.push({ y: yDomain[0], y2: crossings[0].x, sign: below(crossings[0].stability) });
    for (let k = 0; k + 1 < crossings.length; k++) {
      const s1 = above(crossings[k].stability);
      const s2 = below(crossings[k + 1].stability);
      bands.push({ y: crossings[k].x, y2: crossings[k + 1].x, sign: s1 === s2 ? s1 : 0 });
    }
    const top = crossings[crossings.length - 1];
    bands.push({ y: top.x, y2: yDomain[1], sign: above(top.stability) });
    for (const band of bands) {
      const y = Math.max(band.y, yDomain[0]);
      const y2 = Math.min(band.y2, yDomain[1]);
      if (band.sign === 0 || !(y2 > y)) continue;
      out.push({
        parameter: mu - width / 2,
        parameter2: mu + width / 2,
        y,
        y2,
        sign: band.sign > 0 ? 'increasing' : 'decreasing',
      });
    }
  }
  return out;
}

export interface BranchDiagramOptions {
  parameter: string;
  /** A variable name, or NORM_AXIS. */
  yVariable: string;
  /** The model's variable names (shading is drawn only for one-variable models). */
  variables: readonly string[];
  palette: PlotPalette;
  /** Index of the event to highlight (from the events table). */
  selectedEvent?: number | null;
  /** Measured data drawn over the branch (value and error bar against the parameter). */
  measurements?: readonly MeasurementOverlay[];
  width?: number | 'container';
  height?: number;
}

/** One named set of measurements over a plot. */
export interface MeasurementOverlay {
  name: string;
  rows: readonly MeasurementRow[];
}

/** Events in words, as the plot labels and the events table name them. */
export const EVENT_NAMES: Record<BranchEvent['kind'], string> = {
  fold: 'fold',
  hopf: 'Hopf',
  'branch-point': 'branch point',
};

/** Vega-lite spec of a branch diagram: parameter horizontally, the chosen variable (or norm) vertically. */
export function branchDiagramSpec(result: ContinuationResult, o: BranchDiagramOptions): TopLevelSpec {
  const { points, events } = result.branch;
  const p = o.palette;
  const segments = splitByStability(points, o.yVariable);
  // Only the kinds present appear in the legend.
  const stability = stabilityScales(p, segments.map((seg) => seg.stability));
  const lineRows = segments.flatMap((s) =>
    s.points.map((pt, order) => ({
      segment: s.index,
      stability: STABILITY_LABEL[s.stability],
      mu: pt.parameter,
      y: pt.y,
      order,
    })),
  );
  const yValues = lineRows.map((r) => r.y);
  const measured = (o.measurements ?? []).flatMap((m) =>
    m.rows.map((r) => ({ set: m.name, mu: r.parameter, y: r.value, low: r.value - (r.errorLow ?? 0), high: r.value + (r.errorHigh ?? 0) })),
  );
  const muRange = paddedRange(
    [...points.map((pt) => pt.parameter), ...measured.map((m) => m.mu)],
    0.03,
  );
  const span = 0.12 * (muRange[1] - muRange[0]);
  const folds = events.flatMap((e, i) => (e.kind === 'fold' ? [{ e, i }] : []));
  const prediction = folds.flatMap(({ e, i }) => foldPrediction(e, i, o.yVariable, span));
  const yDomain = paddedRange([...yValues, ...events.map((e) => projectState(e.state, o.yVariable)), ...measured.flatMap((m) => [m.low, m.high])]);
  const predictionRows = prediction
    .filter((r) => r.y >= yDomain[0] && r.y <= yDomain[1])
    .map((r) => ({
      key: `${r.event}:${r.sign}`,
      mu: r.parameter,
      y: r.y,
      order: r.sign * (r.parameter - events[r.event].parameter),
    }));

  const hoverRows = points.map((pt, i) => ({
    index: i,
    mu: pt.parameter,
    y: projectState(pt.state, o.yVariable),
    stability: STABILITY_LABEL[pt.stability],
    eigenvalues: formatEigenvalues(pt.eigenvalues),
    state: Object.entries(pt.state)
      .map(([k, v]) => `${k} = ${formatNumber(v)}`)
      .join(', '),
  }));
  const eventRows = events.map((e, i) => ({
    index: i,
    kind: e.kind,
    mu: e.parameter,
    y: projectState(e.state, o.yVariable),
    label: `${EVENT_NAMES[e.kind]}  ${o.parameter} = ${formatNumber(e.parameter)}`,
    a: e.kind === 'fold' ? formatNumber(e.normalForm.a) : '—',
    b: e.kind === 'fold' ? formatNumber(e.normalForm.b) : '—',
    selected: i === o.selectedEvent,
  }));

  const x = quantitativeChannel('mu', o.parameter, muRange);
  const y = quantitativeChannel('y', o.yVariable, yDomain);

  const layers: Record<string, unknown>[] = [];
  if (o.variables.length === 1 && o.yVariable === o.variables[0]) {
    const bands = flowBands(points, o.yVariable, yDomain);
    layers.push({
      name: 'flow',
      data: {
        values: bands.map((b) => ({ mu: b.parameter, mu2: b.parameter2, y: b.y, y2: b.y2, sign: b.sign })),
      },
      mark: { type: 'rect', opacity: 0.55 },
      encoding: {
        x: { ...x, field: 'mu' },
        x2: { field: 'mu2' },
        y: { ...y, field: 'y' },
        y2: { field: 'y2' },
        color: {
          field: 'sign',
          type: 'nominal',
          title: `sign of ${o.yVariable}′`,
          scale: { domain: ['increasing', 'decreasing'], range: [p.flowUp, p.flowDown] },
          legend: {
            labelExpr: `datum.label === 'increasing' ? '${o.yVariable}′ > 0 (rises)' : '${o.yVariable}′ < 0 (falls)'`,
          },
        },
      },
    });
  }
  layers.push({
    name: 'prediction',
    data: { values: predictionRows },
    mark: { type: 'line', strokeWidth: 1.2, opacity: 0.45, strokeDash: [2, 2], color: p.muted },
    encoding: { x, y, detail: { field: 'key' }, order: { field: 'order', type: 'quantitative' } },
  });
  layers.push({
    name: 'branch',
    data: { values: lineRows },
    mark: { type: 'line', strokeWidth: 2.2, strokeCap: 'round' },
    encoding: {
      x,
      y,
      detail: { field: 'segment' },
      order: { field: 'order', type: 'quantitative' },
      color: stabilityColor(p, segments.map((seg) => seg.stability), null),
      strokeDash: {
        field: 'stability',
        type: 'nominal',
        scale: stability.dash,
        legend: null,
      },
    },
  });
  layers.push(
    hoverLayer(hoverRows, x, y, [
      { field: 'mu', title: o.parameter, number: true },
      { field: 'y', title: o.yVariable, number: true },
      { field: 'state', title: 'state' },
      { field: 'stability', title: 'stability' },
      { field: 'eigenvalues', title: 'eigenvalues' },
    ]),
  );
  if (measured.length > 0) {
    const colour = p.measured ?? p.series[5];
    layers.push(
      { name: 'measured-error', data: { values: measured }, mark: { type: 'rule', color: colour }, encoding: { x, y: { ...y, field: 'low' }, y2: { field: 'high' } } },
      {
        name: 'measured',
        data: { values: measured },
        mark: { type: 'point', shape: 'diamond', filled: true, size: 40, color: colour },
        encoding: { x, y, tooltip: [{ field: 'set', type: 'nominal', title: 'measured' }, { field: 'mu', type: 'quantitative', title: o.parameter, format: '.5~g' }, { field: 'y', type: 'quantitative', title: o.yVariable, format: '.5~g' }] },
      },
    );
  }
  if (eventRows.length > 0) {
    layers.push({
      name: 'events',
      data: { values: eventRows },
      layer: [
        {
          mark: { type: 'point', shape: 'diamond', filled: true, stroke: p.surface, strokeWidth: 1.5 },
          encoding: {
            x,
            y,
            size: { condition: { test: 'datum.selected', value: 260 }, value: 110 },
            color: { condition: { test: 'datum.selected', value: p.accent }, value: p.ink },
            tooltip: [
              { field: 'label', type: 'nominal', title: 'event' },
              { field: 'y', type: 'quantitative', title: o.yVariable, format: '.5~g' },
              { field: 'a', type: 'nominal', title: 'a = w·f_μ' },
              { field: 'b', type: 'nominal', title: 'b = w·D²f(v,v)' },
            ],
          },
        },
        {
          mark: {
            type: 'text',
            align: 'left',
            dx: 8,
            dy: -8,
            fontSize: 11,
            font: labelFont(p),
          },
          encoding: {
            x,
            y,
            text: { field: 'label' },
            color: { condition: { test: 'datum.selected', value: p.accent }, value: p.ink },
          },
        },
      ],
    });
  }
  return layeredPlot(p, layers, o, {
    resolve: { scale: { color: 'independent' } },
  }) as unknown as TopLevelSpec;
}
