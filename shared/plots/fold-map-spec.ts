import type { TopLevelSpec } from 'vega-lite';
import type { FoldCurveResult } from '@shared/engine/contract.ts';
import { levelCrossings } from './level-crossings.ts';
import {
  formatNumber,
  hoverLayer,
  layeredPlot,
  paddedRange,
  quantitativeChannel,
  type PlotPalette,
} from './plot-style.ts';

export interface RegionBand {
  x: number;
  x2: number;
  y: number;
  y2: number;
}

/**
 * The region of the (p₁, p₂) plane where the model has two more equilibria than just outside
 * the fold curve: in the cusp picture, the wedge where two stable states coexist (bistability).
 *
 * Reasoning: crossing the fold curve in the direction of p₁ creates or destroys one pair of
 * equilibria, and the fold's normal form says on which side the pair lives: with
 * a = w·∂f/∂p₁ and b = w·D²f(v, v) (the engine reports them per curve point, with respect to
 * the first parameter), the pair exists where −a(p₁ − p₁*)/b > 0, i.e. towards larger p₁ when
 * −a/b > 0. The plane is cut into horizontal strips (p₂ fixed); along each strip the curve's
 * crossings are found on its polyline and each crossing opens the region towards its pair's
 * side, up to the next crossing or the edge of the plot. Crossings whose normal form is
 * degenerate (b = 0, at the cusp itself) are skipped.
 */
export function bistableBands(
  curve: FoldCurveResult['curve'],
  p1: string,
  p2: string,
  xDomain: [number, number],
  rows = 120,
): RegionBand[] {
  const pts = curve.points
    .map((q) => ({
      x: q.parameters[p1],
      y: q.parameters[p2],
      side: q.normalForm.b === 0 ? 0 : Math.sign(-q.normalForm.a / q.normalForm.b),
    }))
    .filter((q) => Number.isFinite(q.x) && Number.isFinite(q.y));
  if (pts.length < 2) return [];
  const ys = pts.map((q) => q.y);
  const lo = Math.min(...ys);
  const hi = Math.max(...ys);
  if (!(hi > lo)) return [];
  const h = (hi - lo) / rows;
  const bands: RegionBand[] = [];
  for (let r = 0; r < rows; r++) {
    const y = lo + (r + 0.5) * h;
    const crossings = levelCrossings(ys, y)
      .map(({ i, t }) => {
        const a = pts[i];
        const b = pts[i + 1];
        return { x: a.x + t * (b.x - a.x), side: t < 0.5 ? a.side || b.side : b.side || a.side };
      })
      .filter((c) => c.side !== 0);
    crossings.sort((m, n) => m.x - n.x);
    const push = (x: number, x2: number) => {
      const from = Math.max(x, xDomain[0]);
      const to = Math.min(x2, xDomain[1]);
      if (to > from) bands.push({ x: from, x2: to, y: y - h / 2, y2: y + h / 2 });
    };
    crossings.forEach((c, k) => {
      if (c.side > 0) push(c.x, k + 1 < crossings.length ? crossings[k + 1].x : xDomain[1]);
      else if (k === 0) push(xDomain[0], c.x);
      else if (crossings[k - 1].side < 0) push(crossings[k - 1].x, c.x);
    });
  }
  return bands;
}

export interface FoldMapOptions {
  palette: PlotPalette;
  width?: number | 'container';
  height?: number;
}

/** Vega-lite spec of a fold map: the fold curve in (p₁, p₂), cusps marked, the bistable region shaded. */
export function foldMapSpec(
  result: FoldCurveResult,
  parameters: readonly [string, string],
  o: FoldMapOptions,
): TopLevelSpec {
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
  const cusps = curve.events.map((e, i) => ({
    index: i,
    x: e.parameters[p1],
    y: e.parameters[p2],
    label: `cusp  (${formatNumber(e.parameters[p1])}, ${formatNumber(e.parameters[p2])})`,
  }));
  const xDomain = paddedRange(rows.map((r) => r.x));
  const yDomain = paddedRange(rows.map((r) => r.y));
  const bands = bistableBands(curve, p1, p2, xDomain);
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
        {
          mark: { type: 'point', shape: 'triangle-up', filled: true, size: 140, color: p.unstable },
          encoding: { x, y, tooltip: { field: 'label' } },
        },
        {
          mark: { type: 'text', align: 'left', dx: 9, dy: -9, fontSize: 11, color: p.ink },
          encoding: { x, y, text: { field: 'label' } },
        },
      ],
    });
  }
  return layeredPlot(p, layers, o) as unknown as TopLevelSpec;
}
