import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { bistableBands, foldMapSpec } from '@/features/cells/plots/fold-map-spec.ts';
import { DEFAULT_PALETTE } from '@/features/cells/plots/plot-palette.ts';
import { cuspFoldCurve } from './plot-fixtures.ts';

describe('bistableBands', () => {
  it('shades the cusp wedge |h| < 2(r/3)^{3/2} of x′ = h + r·x − x³ (Strogatz, §3.6)', () => {
    const { curve } = cuspFoldCurve(401);
    const bands = bistableBands(curve, 'r', 'h', 30);
    expect(bands.length).toBe(30);
    for (const b of bands) {
      const r = (b.x + b.x2) / 2;
      const edge = 2 * (r / 3) ** 1.5;
      // Polyline interpolation of the curve: within 1 % of the wedge's half-width.
      expect(b.y).toBeCloseTo(-edge, 2);
      expect(b.y2).toBeCloseTo(edge, 2);
    }
  });

  it('shades nothing where the curve crosses a strip only once', () => {
    const { curve } = cuspFoldCurve(101);
    const half = { ...curve, points: curve.points.slice(50) };
    expect(bistableBands(half, 'r', 'h', 20)).toEqual([]);
  });
});

describe('foldMapSpec', () => {
  const spec = foldMapSpec(cuspFoldCurve(), ['r', 'h'], { palette: DEFAULT_PALETTE });
  it('compiles with vega-lite', () => {
    expect(() => compile(spec)).not.toThrow();
  });
  it('marks the cusp in words and shades the region', () => {
    const layers = (spec as unknown as { layer: { name: string; data: { values: { label?: string }[] } }[] })
      .layer;
    const cusps = layers.find((l) => l.name === 'cusps')!;
    expect(cusps.data.values[0].label).toBe('cusp  (0, 0)');
    expect(layers.find((l) => l.name === 'region')!.data.values.length).toBeGreaterThan(50);
  });
});
