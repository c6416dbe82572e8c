import type { TopLevelSpec } from 'vega-lite';
import type { ContinuationResult, FoldCurveResult, SimulateResult } from '@shared/engine/contract.ts';
import { displayName } from '@shared/diff/format.ts';
import { projectState, splitByStability } from './branch-diagram-spec.ts';
import { layeredPlot, paddedRange, quantitativeChannel, type PlotPalette } from './plot-style.ts';
import { stabilityColor } from './stability-style.ts';
import { thinIndices } from './trajectory-spec.ts';

/**
 * Plots of two revisions of one cell drawn over each other: the older faint and thin, the newer
 * strong. Colour keeps its meaning (stable / unstable on branches); the revision is told apart by
 * opacity and width, and named in the legend ("before", "now").
 */

export const REVISION_LABELS = { older: 'before', newer: 'now' } as const;
type Side = keyof typeof REVISION_LABELS;

const OPACITY: Record<Side, number> = { older: 0.35, newer: 1 };
const WIDTH: Record<Side, number> = { older: 1.6, newer: 2.6 };

const REVISION_DOMAIN = [REVISION_LABELS.older, REVISION_LABELS.newer];
const revisionChannels = {
  opacity: {
    field: 'revision',
    type: 'ordinal' as const,
    sort: REVISION_DOMAIN,
    title: 'revision',
    scale: { domain: REVISION_DOMAIN, range: [OPACITY.older, OPACITY.newer] },
    // Said in the figure's caption: a legend of opacity, width and dash together draws no readable symbol.
    legend: null,
  },
  strokeWidth: {
    field: 'revision',
    type: 'ordinal' as const,
    sort: REVISION_DOMAIN,
    title: 'revision',
    scale: { domain: REVISION_DOMAIN, range: [WIDTH.older, WIDTH.newer] },
    legend: null,
  },
  /** The older revision is also dashed, so the two stay apart where they nearly coincide (and in print). */
  strokeDash: {
    field: 'revision',
    type: 'ordinal' as const,
    sort: REVISION_DOMAIN,
    title: 'revision',
    scale: { domain: REVISION_DOMAIN, range: [[5, 3], [1, 0]] },
    legend: null,
  },
};

/** Axes with room between tick labels. */
const axis = { tickCount: 8, labelOverlap: true, labelFlush: true };

export interface BranchOverlayOptions {
  parameter: string;
  yVariable: string;
  palette: PlotPalette;
  height?: number;
}

/** Two branch diagrams overlaid: segments coloured by stability, events as diamonds. */
export function branchOverlaySpec(older: ContinuationResult | null, newer: ContinuationResult | null, o: BranchOverlayOptions): TopLevelSpec {
  const sides: [Side, ContinuationResult | null][] = [['older', older], ['newer', newer]];
  const lineRows = sides.flatMap(([side, r]) =>
    r
      ? splitByStability(r.branch.points, o.yVariable).flatMap((s) =>
          s.points.map((pt, order) => ({ revision: REVISION_LABELS[side], segment: `${side}:${s.index}`, stability: s.stability, mu: pt.parameter, y: pt.y, order })),
        )
      : [],
  );
  const eventRows = sides.flatMap(([side, r]) =>
    r ? r.branch.events.map((e) => ({ revision: REVISION_LABELS[side], kind: e.kind, mu: e.parameter, y: projectState(e.state, o.yVariable) })) : [],
  );
  const x = { ...quantitativeChannel('mu', displayName(o.parameter), paddedRange(lineRows.map((r) => r.mu), 0.03)), axis };
  const y = { ...quantitativeChannel('y', displayName(o.yVariable), paddedRange([...lineRows.map((r) => r.y), ...eventRows.map((r) => r.y)])), axis };
  const p = o.palette;
  const layers: object[] = [
    {
      name: 'branches',
      data: { values: lineRows },
      mark: { type: 'line', strokeCap: 'round' },
      encoding: {
        x,
        y,
        detail: { field: 'segment' },
        order: { field: 'order', type: 'quantitative' },
        color: stabilityColor(p, lineRows.map((r) => r.stability), 'stability'),
        ...revisionChannels,
      },
    },
  ];
  if (eventRows.length > 0) {
    layers.push({
      name: 'events',
      data: { values: eventRows },
      mark: { type: 'point', shape: 'diamond', filled: true, size: 110, stroke: p.surface, strokeWidth: 1 },
      encoding: {
        x,
        y,
        color: { value: p.ink },
        opacity: revisionChannels.opacity,
        tooltip: [
          { field: 'revision', type: 'nominal' },
          { field: 'kind', type: 'nominal', title: 'event' },
          { field: 'mu', type: 'quantitative', title: o.parameter, format: '.5~g' },
        ],
      },
    });
  }
  return layeredPlot(p, layers, { height: o.height ?? 300 }) as TopLevelSpec;
}

/** Two fold curves in the plane of two parameters, with their cusps. */
export function foldCurveOverlaySpec(older: FoldCurveResult | null, newer: FoldCurveResult | null, parameters: readonly [string, string], palette: PlotPalette): TopLevelSpec {
  const [p1, p2] = parameters;
  const sides: [Side, FoldCurveResult | null][] = [['older', older], ['newer', newer]];
  const rows = sides.flatMap(([side, r]) =>
    r ? r.curve.points.map((pt, order) => ({ revision: REVISION_LABELS[side], a: pt.parameters[p1], b: pt.parameters[p2], order })) : [],
  );
  const cusps = sides.flatMap(([side, r]) => (r ? r.curve.events.map((e) => ({ revision: REVISION_LABELS[side], a: e.parameters[p1], b: e.parameters[p2] })) : []));
  const x = { ...quantitativeChannel('a', displayName(p1), paddedRange(rows.map((r) => r.a))), axis };
  const y = { ...quantitativeChannel('b', displayName(p2), paddedRange(rows.map((r) => r.b))), axis };
  const layers: object[] = [
    {
      name: 'fold-curves',
      data: { values: rows },
      mark: { type: 'line', color: palette.accent },
      encoding: { x, y, detail: { field: 'revision' }, order: { field: 'order', type: 'quantitative' }, ...revisionChannels },
    },
  ];
  if (cusps.length) {
    layers.push({
      name: 'cusps',
      data: { values: cusps },
      mark: { type: 'point', shape: 'triangle-up', filled: true, size: 120, color: palette.ink },
      encoding: { x, y, opacity: { ...revisionChannels.opacity, legend: null } },
    });
  }
  return layeredPlot(palette, layers, { height: 300 }) as TopLevelSpec;
}

/** Two simulations: every variable against time, one colour per variable. */
export function trajectoryOverlaySpec(older: SimulateResult | null, newer: SimulateResult | null, palette: PlotPalette): TopLevelSpec {
  const sides: [Side, SimulateResult | null][] = [['older', older], ['newer', newer]];
  const rows = sides.flatMap(([side, r]) => {
    if (!r) return [];
    const idx = thinIndices(r.trajectory.t.length);
    return Object.entries(r.trajectory.state).flatMap(([name, values]) =>
      idx.map((i) => ({ revision: REVISION_LABELS[side], variable: displayName(name), t: r.trajectory.t[i], value: values[i], key: `${side}:${name}` })),
    );
  });
  const x = { ...quantitativeChannel('t', 't', paddedRange(rows.map((r) => r.t), 0)), axis };
  const y = { ...quantitativeChannel('value', 'value', paddedRange(rows.map((r) => r.value))), axis };
  return layeredPlot(
    palette,
    [
      {
        name: 'trajectories',
        data: { values: rows },
        mark: { type: 'line' },
        encoding: { x, y, detail: { field: 'key' }, color: { field: 'variable', type: 'nominal', scale: { range: palette.series } }, ...revisionChannels },
      },
    ],
    { height: 260 },
  ) as TopLevelSpec;
}
