import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import { bistableBands, foldMapSpec } from '@shared/plots/fold-map-spec.ts';
import { DEFAULT_PALETTE } from '@shared/plots/plot-style.ts';
import { cuspFoldCurve } from './plot-fixtures.ts';

describe('bistableBands', () => {
  it('shades the cusp wedge |h| < 2(r/3)^{3/2} of x′ = h + r·x − x³ (Strogatz, §3.6)', () => {
    const { curve } = cuspFoldCurve(401);
    const right = 3.2;
    const bands = bistableBands(curve, 'r', 'h', [-0.2, right], 40);
    expect(bands.length).toBeGreaterThan(30);
    for (const b of bands) {
      const h = (b.y + b.y2) / 2;
      // The wedge's edge at this h: r = 3(|h|/2)^{2/3}; the region reaches the plot's right edge.
      expect(b.x).toBeCloseTo(3 * (Math.abs(h) / 2) ** (2 / 3), 2);
      expect(b.x2).toBe(right);
    }
  });

  it('opens the region towards the side the normal form names', () => {
    const { curve } = cuspFoldCurve(201);
    const flipped = {
      ...curve,
      points: curve.points.map((q) => ({ ...q, normalForm: { a: -q.normalForm.a, b: q.normalForm.b } })),
    };
    const bands = bistableBands(flipped, 'r', 'h', [-0.2, 3.2], 20);
    expect(bands.every((b) => b.x === -0.2)).toBe(true);
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
