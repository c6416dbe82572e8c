import type { TopLevelSpec } from 'vega-lite';
import type { FoldCurveResult } from '@shared/engine/contract.ts';
import { formatNumber, hoverLayer, layeredPlot, paddedRange, quantitativeChannel, type PlotPalette } from './plot-palette.ts';

export interface RegionBand {
  x: number;
  x2: number;
  y: number;
  y2: number;
}

/**
 * The region of the (p₁, p₂) plane where the model has two more equilibria than outside.
 *
 * Reasoning: crossing a fold curve transversally creates or destroys one pair of equilibria.
 * Walking up a vertical line p₁ = const from far below (taken as outside, with the fewest
 * equilibria, as in the cusp picture), the count goes up by two at the first crossing, down at
 * the second, and so on: the region lies between crossings 1–2, 3–4, …. Near a cusp that region
 * is the wedge where two stable equilibria coexist with a saddle between them (bistability).
 * The plane is cut into `columns` vertical strips; each strip's crossings come from the fold
 * curve's polyline. Strips where the curve does not reach are blank.
 */
export function bistableBands(curve: FoldCurveResult['curve'], p1: string, p2: string, columns = 120): RegionBand[] {
  const pts = curve.points.map((q) => ({ x: q.parameters[p1], y: q.parameters[p2] })).filter((q) => Number.isFinite(q.x) && Number.isFinite(q.y));
  if (pts.length < 2) return [];
  const xs = pts.map((q) => q.x);
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  if (!(hi > lo)) return [];
  const w = (hi - lo) / columns;
  const bands: RegionBand[] = [];
  for (let c = 0; c < columns; c++) {
    const x = lo + (c + 0.5) * w;
    const ys: number[] = [];
    for (let i = 0; i + 1 < pts.length; i++) {
      const a = pts[i];
      const b = pts[i + 1];
      if ((a.x - x) * (b.x - x) > 0 || a.x === b.x) continue;
      if (b.x === x && i + 2 < pts.length) continue;
      ys.push(a.y + ((x - a.x) / (b.x - a.x)) * (b.y - a.y));
    }
    ys.sort((m, n) => m - n);
    for (let k = 0; k + 1 < ys.length; k += 2) bands.push({ x: x - w / 2, x2: x + w / 2, y: ys[k], y2: ys[k + 1] });
  }
  return bands;
}

export interface FoldMapOptions {
  palette: PlotPalette;
  width?: number | 'container';
  height?: number;
}

/** Vega-lite spec of a fold map: the fold curve in (p₁, p₂), cusps marked, the bistable region shaded. */
export function foldMapSpec(result: FoldCurveResult, parameters: readonly [string, string], o: FoldMapOptions): TopLevelSpec {
  const [p1, p2] = parameters;
  const p = o.palette;
  const curve = result.curve;
  const rows = curve.points.map((q, i) => ({
    order: i,
    x: q.parameters[p1],
    y: q.parameters[p2],
    a: formatNumber(q.normalForm.a),
    b: formatNumber(q.normalForm.b),
    state: Object.entries(q.state)
      .map(([k, v]) => `${k} = ${formatNumber(v)}`)
      .join(', '),
  }));
  const bands = bistableBands(curve, p1, p2);
  const cusps = curve.events.map((e, i) => ({
    index: i,
    x: e.parameters[p1],
    y: e.parameters[p2],
    label: `cusp  (${formatNumber(e.parameters[p1])}, ${formatNumber(e.parameters[p2])})`,
  }));
  const xDomain = paddedRange(rows.map((r) => r.x));
  const yDomain = paddedRange(rows.map((r) => r.y));
  const x = quantitativeChannel('x', p1, xDomain);
  const y = quantitativeChannel('y', p2, yDomain);
  const layers: Record<string, unknown>[] = [
    {
      name: 'region',
      data: { values: bands.map((b) => ({ ...b, region: 'two stable states (bistable)' })) },
      mark: { type: 'rect', opacity: 0.8 },
      encoding: {
        x: { ...x, field: 'x' },
        x2: { field: 'x2' },
        y: { ...y, field: 'y' },
        y2: { field: 'y2' },
        color: { field: 'region', type: 'nominal', title: null, scale: { range: [p.region] } },
      },
    },
    {
      name: 'fold-curve',
      data: { values: rows },
      layer: [
        {
          mark: { type: 'line', strokeWidth: 2.2, color: p.ink },
          encoding: { x, y, order: { field: 'order', type: 'quantitative' } },
        },
        hoverLayer(rows, x, y, [
          { field: 'x', title: p1, number: true },
          { field: 'y', title: p2, number: true },
          { field: 'state', title: 'fold at' },
          { field: 'a', title: 'a' },
          { field: 'b', title: 'b' },
        ]),
      ],
    },
  ];
  if (cusps.length > 0) {
    layers.push({
      name: 'cusps',
      data: { values: cusps },
      layer: [
        { mark: { type: 'point', shape: 'triangle-up', filled: true, size: 140, color: p.unstable }, encoding: { x, y, tooltip: { field: 'label' } } },
        { mark: { type: 'text', align: 'left', dx: 9, dy: -9, fontSize: 11, color: p.ink }, encoding: { x, y, text: { field: 'label' } } },
      ],
    });
  }
  return layeredPlot(p, layers, o) as unknown as TopLevelSpec;
}
