import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import {
  branchDiagramSpec,
  flowBands,
  foldPrediction,
  NORM_AXIS,
  projectState,
  splitByStability,
} from '@shared/plots/branch-diagram-spec.ts';
import { DEFAULT_PALETTE } from '@shared/plots/plot-style.ts';
import { firstFold, mirroredSaddleNodeBranch, saddleNodeBranch } from './plot-fixtures.ts';

type Layer = {
  name?: string;
  data?: { values: Record<string, unknown>[] };
  mark?: unknown;
  encoding?: Record<string, unknown>;
};

function layer(spec: unknown, name: string): Layer {
  const found = (spec as { layer: Layer[] }).layer.find((l) => l.name === name);
  if (!found) throw new Error(`no layer ${name}`);
  return found;
}

describe('splitByStability', () => {
  it('splits the saddle-node branch into unstable, neutral and stable runs that share their boundary points', () => {
    // x' = μ − x² (Strogatz, Nonlinear Dynamics and Chaos, §3.1): x < 0 unstable, x > 0 stable.
    const { branch } = saddleNodeBranch(81);
    const segs = splitByStability(branch.points, 'x');
    expect(segs.map((s) => s.stability)).toEqual(['unstable', 'neutral', 'stable']);
    for (let k = 1; k < segs.length; k++) {
      const prevLast = segs[k - 1].points[segs[k - 1].points.length - 1];
      expect(segs[k].points[0]).toEqual(prevLast);
    }
    expect(segs[0].points.every((p) => p.y <= 0)).toBe(true);
    expect(segs[2].points.every((p) => p.y >= 0)).toBe(true);
    // Every point appears, the shared ones twice.
    expect(segs.reduce((n, s) => n + s.points.length, 0)).toBe(81 + segs.length - 1);
  });

  it('starts a new run at each change, even when stability returns to an earlier kind', () => {
    const { branch } = saddleNodeBranch(9);
    const pts = branch.points.map((p, i) => ({
      ...p,
      stability: (i % 4 < 2 ? 'stable' : 'unstable') as 'stable' | 'unstable',
    }));
    expect(splitByStability(pts, 'x').map((s) => s.stability)).toEqual([
      'stable',
      'unstable',
      'stable',
      'unstable',
      'stable',
    ]);
  });
});

describe('projectState', () => {
  it('gives a variable or the Euclidean norm', () => {
    expect(projectState({ x: 3, y: 4 }, 'y')).toBe(4);
    expect(projectState({ x: 3, y: 4 }, NORM_AXIS)).toBe(5);
    expect(projectState({ x: 3 }, 'z')).toBeNaN();
  });
});

describe('foldPrediction', () => {
  it('matches the closed form x = ±√μ of x′ = μ − x² and lies on the side equilibriaSide says (above)', () => {
    const r = saddleNodeBranch();
    const pred = foldPrediction(firstFold(r), 0, 'x', 0.5);
    expect(pred.length).toBeGreaterThan(10);
    for (const p of pred) {
      expect(p.parameter).toBeGreaterThanOrEqual(0);
      // Normal form is exact for this model: x = sign·√μ (Strogatz §3.1).
      expect(p.y).toBeCloseTo(p.sign * Math.sqrt(p.parameter), 12);
    }
    expect(Math.max(...pred.map((p) => p.parameter))).toBeCloseTo(0.5, 12);
  });

  it('lies below μ* when equilibriaSide is "below"', () => {
    const r = mirroredSaddleNodeBranch();
    const pred = foldPrediction(firstFold(r), 0, 'x', 0.5);
    expect(pred.every((p) => p.parameter <= 0)).toBe(true);
    for (const p of pred) expect(p.y).toBeCloseTo(p.sign * Math.sqrt(-p.parameter), 12);
  });

  it('draws nothing for a degenerate fold', () => {
    const e = firstFold(saddleNodeBranch());
    expect(
      foldPrediction({ ...e, normalForm: { ...e.normalForm, nondegenerate: false } }, 0, 'x', 1),
    ).toEqual([]);
  });
});

describe('flowBands', () => {
  it('shades x′ = μ − x² with the right signs: falling below −√μ and above √μ, rising between', () => {
    const { branch } = saddleNodeBranch(201);
    const bands = flowBands(branch.points, 'x', [-1.5, 1.5], 20);
    expect(bands.length).toBeGreaterThan(0);
    for (const b of bands) {
      const mu = (b.parameter + b.parameter2) / 2;
      const mid = (b.y + b.y2) / 2;
      // Sign of f(x, μ) = μ − x² at the band's middle, straight from the formula.
      const f = mu - mid * mid;
      expect(b.sign).toBe(f > 0 ? 'increasing' : 'decreasing');
    }
    // Each column has three bands: below the unstable, between, above the stable equilibrium.
    const firstColumn = bands.filter((b) => b.parameter === bands[0].parameter);
    expect(firstColumn.map((b) => b.sign)).toEqual(['decreasing', 'increasing', 'decreasing']);
  });

  it('leaves a band blank where its two equilibria disagree (an equilibrium the branch missed)', () => {
    const { branch } = saddleNodeBranch(41);
    const bothStable = branch.points.map((p) => ({ ...p, stability: 'stable' as const }));
    const bands = flowBands(bothStable, 'x', [-1.5, 1.5], 10);
    // Between two stable equilibria x′ would have to change sign: no band is drawn there.
    for (const b of bands) expect(b.y2 <= 0 || b.y >= 0).toBe(true);
  });
});

describe('branchDiagramSpec', () => {
  const result = saddleNodeBranch();
  const spec = branchDiagramSpec(result, {
    parameter: 'mu',
    yVariable: 'x',
    variables: ['x'],
    palette: DEFAULT_PALETTE,
    selectedEvent: 0,
  });

  it('compiles with vega-lite', () => {
    expect(() => compile(spec)).not.toThrow();
  });

  it('draws stable runs solid and unstable runs dashed, in the semantic colours', () => {
    const branch = layer(spec, 'branch');
    const enc = branch.encoding as {
      color: { scale: { domain: string[]; range: string[] } };
      strokeDash: { scale: { domain: string[]; range: number[][] } };
    };
    const dash = Object.fromEntries(
      enc.strokeDash.scale.domain.map((d, i) => [d, enc.strokeDash.scale.range[i]]),
    );
    expect(dash.stable).toEqual([1, 0]);
    expect(dash.unstable[0]).toBeGreaterThan(1);
    const colour = Object.fromEntries(enc.color.scale.domain.map((d, i) => [d, enc.color.scale.range[i]]));
    expect(colour.stable).toBe(DEFAULT_PALETTE.stable);
    expect(colour.unstable).toBe(DEFAULT_PALETTE.unstable);
    const rows = branch.data!.values as { segment: number; stability: string; y: number }[];
    const segs = new Map<number, Set<string>>();
    for (const r of rows) segs.set(r.segment, (segs.get(r.segment) ?? new Set()).add(r.stability));
    expect([...segs.values()].every((s) => s.size === 1)).toBe(true);
    expect(rows.filter((r) => r.stability === 'unstable').every((r) => r.y <= 0)).toBe(true);
  });

  it('labels the fold in words with its parameter value and highlights the selected one', () => {
    const ev = layer(spec, 'events');
    const rows = ev.data!.values as { label: string; selected: boolean }[];
    expect(rows[0].label).toBe('fold  mu = 0');
    expect(rows[0].selected).toBe(true);
  });

  it('draws the normal-form prediction only on the side where the pair exists', () => {
    const rows = layer(spec, 'prediction').data!.values as { mu: number }[];
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.mu >= 0)).toBe(true);
  });

  it('shades the flow only for one-variable models plotted against that variable', () => {
    expect(() => layer(spec, 'flow')).not.toThrow();
    const two = branchDiagramSpec(result, {
      parameter: 'mu',
      yVariable: 'x',
      variables: ['x', 'y'],
      palette: DEFAULT_PALETTE,
    });
    expect(() => layer(two, 'flow')).toThrow();
  });
});
