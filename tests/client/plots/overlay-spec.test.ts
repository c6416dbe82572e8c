import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { analyze } from '@server/engine/index.ts';
import { DEFAULT_PALETTE } from '@shared/plots/plot-style.ts';
import { branchOverlaySpec, foldCurveOverlaySpec, REVISION_LABELS, trajectoryOverlaySpec } from '@shared/plots/overlay-spec.ts';

type Layer = { name?: string; data?: { values: Record<string, unknown>[] }; encoding?: Record<string, { scale?: { domain?: unknown[]; range?: unknown[] } }> };
const layer = (spec: unknown, name: string): Layer => {
  const found = (spec as { layer: Layer[] }).layer.find((l) => l.name === name);
  if (!found) throw new Error(`no layer ${name}`);
  return found;
};

// x' = μ − x² (fold at μ = 0) and x' = μ + 0.01 − x² (fold at μ = −0.01): Strogatz, Nonlinear
// Dynamics and Chaos, §3.1 (closed form).
const run = (rhs: string) =>
  analyze({ model: { variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }] }, task: { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 1 } } });

describe('branchOverlaySpec', () => {
  const older = run('mu - x^2');
  const newer = run('mu + 0.01 - x^2');
  const spec = branchOverlaySpec(older, newer, { parameter: 'mu', yVariable: 'x', palette: DEFAULT_PALETTE });

  it('compiles with vega-lite', () => {
    expect(() => compile(spec)).not.toThrow();
  });

  it('draws both revisions, the older faint and thin, the newer strong', () => {
    const branches = layer(spec, 'branches');
    const rows = branches.data!.values;
    expect(new Set(rows.map((r) => r.revision))).toEqual(new Set([REVISION_LABELS.older, REVISION_LABELS.newer]));
    const opacity = branches.encoding!.opacity.scale!;
    expect(opacity.domain).toEqual([REVISION_LABELS.older, REVISION_LABELS.newer]);
    const [faint, strong] = opacity.range as number[];
    expect(faint).toBeLessThan(strong);
    const [thin, thick] = branches.encoding!.strokeWidth.scale!.range as number[];
    expect(thin).toBeLessThan(thick);
  });

  it('marks each revision’s fold where the engine found it', () => {
    const events = layer(spec, 'events').data!.values;
    const at = (rev: string) => events.find((e) => e.revision === rev)!.mu as number;
    expect(at(REVISION_LABELS.older)).toBeCloseTo(0, 8);
    expect(at(REVISION_LABELS.newer)).toBeCloseTo(-0.01, 8);
  });

  it('keeps the stability colours of the branch diagram', () => {
    const colour = layer(spec, 'branches').encoding!.color.scale!;
    const domain = colour.domain as string[];
    expect(domain).toContain('stable');
    expect(domain).toContain('unstable');
    expect(colour.range![domain.indexOf('stable')]).toBe(DEFAULT_PALETTE.stable);
    expect(colour.range![domain.indexOf('unstable')]).toBe(DEFAULT_PALETTE.unstable);
  });

  it('draws one side alone when the other revision has no result', () => {
    const only = branchOverlaySpec(null, newer, { parameter: 'mu', yVariable: 'x', palette: DEFAULT_PALETTE });
    expect(new Set(layer(only, 'branches').data!.values.map((r) => r.revision))).toEqual(new Set([REVISION_LABELS.newer]));
  });
});

describe('foldCurveOverlaySpec and trajectoryOverlaySpec', () => {
  it('overlays two fold curves with their cusps', () => {
    // x' = h + c + r x − x³: cusp at (h, r) = (−c, 0) (Strogatz §3.6; Kuznetsov §8.2).
    const curve = (c: number) =>
      analyze({
        model: { variables: [{ name: 'x', rhs: `h + ${c} + r*x - x^3` }], parameters: [{ name: 'h', value: -c - 2 / (3 * Math.sqrt(3)) }, { name: 'r', value: 1 }] },
        task: { kind: 'fold-curve', parameters: ['h', 'r'], start: { parameters: {}, state: { x: 0.6 } }, bounds: { h: [-1, 1], r: [-1, 2] } },
      });
    const spec = foldCurveOverlaySpec(curve(0), curve(0.1), ['h', 'r'], DEFAULT_PALETTE);
    expect(() => compile(spec)).not.toThrow();
    const cusps = layer(spec, 'cusps').data!.values;
    expect(cusps.map((c) => [c.revision, Math.round((c.a as number) * 1e6) / 1e6])).toEqual([
      [REVISION_LABELS.older, 0],
      [REVISION_LABELS.newer, -0.1],
    ]);
  });

  it('overlays two simulations variable by variable', () => {
    // x' = −k x from x(0) = 1 (closed form e^(−kt)).
    const sim = (k: number) => analyze({ model: { variables: [{ name: 'x', rhs: '-k*x' }], parameters: [{ name: 'k', value: k }] }, task: { kind: 'simulate', initial: { x: 1 }, time: { end: 1, samples: 5 } } });
    const spec = trajectoryOverlaySpec(sim(1), sim(2), DEFAULT_PALETTE);
    expect(() => compile(spec)).not.toThrow();
    const rows = layer(spec, 'trajectories').data!.values;
    expect(rows).toHaveLength(10);
    const last = (rev: string) => rows.filter((r) => r.revision === rev).at(-1)!.value as number;
    expect(last(REVISION_LABELS.older)).toBeCloseTo(Math.exp(-1), 6);
    expect(last(REVISION_LABELS.newer)).toBeCloseTo(Math.exp(-2), 6);
  });
});
