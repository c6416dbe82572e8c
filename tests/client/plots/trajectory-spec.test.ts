import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import type { SimulateResult } from '@shared/engine/contract.ts';
import { phasePlaneSpec, thinIndices, timeSeriesSpec } from '@shared/plots/trajectory-spec.ts';
import { DEFAULT_PALETTE } from '@shared/plots/plot-style.ts';

/** Harmonic oscillator x′ = y, y′ = −x from (1, 0): x = cos t, y = −sin t (closed form). */
function oscillator(n: number): SimulateResult {
  const t = Array.from({ length: n }, (_, i) => (i * 2 * Math.PI) / (n - 1));
  return {
    trajectory: { t, state: { x: t.map(Math.cos), y: t.map((s) => -Math.sin(s)) } },
    stopReason: 'end',
    steps: { accepted: n, rejected: 0 },
    engine: { version: 'test', elapsedMs: 1 },
  };
}

describe('thinIndices', () => {
  it('keeps both ends and at most the limit', () => {
    const idx = thinIndices(10_001, 100);
    expect(idx.length).toBe(100);
    expect(idx[0]).toBe(0);
    expect(idx[99]).toBe(10_000);
    expect(thinIndices(5, 100)).toEqual([0, 1, 2, 3, 4]);
  });
});

describe('trajectory specs', () => {
  it('time series has one row per variable and sample, and compiles', () => {
    const spec = timeSeriesSpec(oscillator(50), ['x', 'y'], { palette: DEFAULT_PALETTE });
    expect((spec as unknown as { data: { values: unknown[] } }).data.values.length).toBe(100);
    expect(() => compile(spec)).not.toThrow();
  });
  it('phase plane follows the circle x² + y² = 1 and marks start and end', () => {
    const spec = phasePlaneSpec(oscillator(50), 'x', 'y', { palette: DEFAULT_PALETTE });
    const layers = (
      spec as unknown as { layer: { data: { values: { x: number; y: number; which?: string }[] } }[] }
    ).layer;
    for (const r of layers[0].data.values) expect(r.x * r.x + r.y * r.y).toBeCloseTo(1, 12);
    expect(layers[1].data.values.map((r) => r.which)).toEqual(['start', 'end']);
    expect(() => compile(spec)).not.toThrow();
  });
});
