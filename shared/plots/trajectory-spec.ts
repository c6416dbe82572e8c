import type { TopLevelSpec } from 'vega-lite';
import type { SimulateResult } from '@shared/engine/contract.ts';
import { paddedRange, plotConfig, quantitativeChannel, type PlotPalette } from './plot-style.ts';

/** At most this many samples are drawn per series; longer runs are thinned evenly (ends kept). */
export const MAX_DRAWN_SAMPLES = 4000;

export function thinIndices(n: number, max = MAX_DRAWN_SAMPLES): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const out: number[] = [];
  for (let k = 0; k < max; k++) out.push(Math.round((k * (n - 1)) / (max - 1)));
  return out;
}

export interface TrajectoryOptions {
  palette: PlotPalette;
  width?: number | 'container';
  height?: number;
}

/** Time series of every variable, one coloured line each. */
export function timeSeriesSpec(
  result: SimulateResult,
  variables: readonly string[],
  o: TrajectoryOptions,
): TopLevelSpec {
  const { t, state } = result.trajectory;
  const idx = thinIndices(t.length);
  const names = variables.filter((v) => state[v]);
  const rows = names.flatMap((v) => idx.map((i) => ({ t: t[i], variable: v, value: state[v][i] })));
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: o.width ?? 'container',
    height: o.height ?? 260,
    config: plotConfig(o.palette),
    data: { values: rows },
    mark: { type: 'line', strokeWidth: 1.8 },
    encoding: {
      x: { field: 't', type: 'quantitative', title: 'time', scale: { nice: false } },
      y: {
        field: 'value',
        type: 'quantitative',
        title: names.length === 1 ? names[0] : 'state',
        scale: { zero: false },
      },
      color: {
        field: 'variable',
        type: 'nominal',
        title: null,
        scale: { domain: names, range: o.palette.series },
      },
      tooltip: [
        { field: 't', type: 'quantitative', format: '.4~g', title: 'time' },
        { field: 'variable', type: 'nominal' },
        { field: 'value', type: 'quantitative', format: '.5~g' },
      ],
    },
  } as TopLevelSpec;
}

/** The path in the plane of two variables, with its start (circle) and end (square) marked. */
export function phasePlaneSpec(
  result: SimulateResult,
  xVar: string,
  yVar: string,
  o: TrajectoryOptions,
): TopLevelSpec {
  const { t, state } = result.trajectory;
  const xs = state[xVar] ?? [];
  const ys = state[yVar] ?? [];
  const idx = thinIndices(Math.min(xs.length, ys.length));
  const rows = idx.map((i, order) => ({ order, t: t[i], x: xs[i], y: ys[i] }));
  const ends =
    rows.length > 0
      ? [
          { ...rows[0], which: 'start' },
          { ...rows[rows.length - 1], which: 'end' },
        ]
      : [];
  const x = quantitativeChannel('x', xVar, paddedRange(rows.map((r) => r.x)));
  const y = quantitativeChannel('y', yVar, paddedRange(rows.map((r) => r.y)));
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: o.width ?? 'container',
    height: o.height ?? 260,
    config: plotConfig(o.palette),
    layer: [
      {
        data: { values: rows },
        mark: { type: 'line', strokeWidth: 1.6, color: o.palette.stable },
        encoding: { x, y, order: { field: 'order', type: 'quantitative' } },
      },
      {
        data: { values: ends },
        mark: { type: 'point', filled: true, size: 80 },
        encoding: {
          x,
          y,
          shape: {
            field: 'which',
            type: 'nominal',
            title: null,
            scale: { domain: ['start', 'end'], range: ['circle', 'square'] },
          },
          color: {
            field: 'which',
            type: 'nominal',
            title: null,
            scale: { domain: ['start', 'end'], range: [o.palette.accent, o.palette.unstable] },
          },
          tooltip: [
            { field: 'which', type: 'nominal', title: 'point' },
            { field: 't', type: 'quantitative', format: '.4~g', title: 'time' },
          ],
        },
      },
    ],
  } as TopLevelSpec;
}
