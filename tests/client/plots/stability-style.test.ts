import { describe, expect, it } from 'vitest';
import { branchDiagramSpec } from '@shared/plots/branch-diagram-spec.ts';
import { branchOverlaySpec } from '@shared/plots/overlay-spec.ts';
import { DEFAULT_PALETTE, PRINT_PALETTE } from '@shared/plots/plot-style.ts';
import { STABILITY_STYLE } from '@shared/plots/stability-style.ts';
import { branchFigureSpec } from '@server/services/figures/figure-specs.ts';
import { saddleNodeBranch } from './plot-fixtures.ts';

type Layer = { name?: string; encoding?: { color?: { field?: string; scale?: { domain: string[]; range: string[] } } } };
const stabilityScale = (spec: unknown) =>
  ((spec as { layer: Layer[] }).layer.find((l) => l.encoding?.color?.field === 'stability')?.encoding?.color?.scale);

describe('one stability style', () => {
  const branch = saddleNodeBranch();
  const kinds = [...new Set(branch.branch.points.map((pt) => pt.stability))];
  const order = (['stable', 'unstable', 'neutral'] as const).filter((k) => kinds.includes(k));
  const expected = (p: typeof DEFAULT_PALETTE) => ({ domain: [...order], range: order.map((k) => STABILITY_STYLE[k].color(p)) });

  it('has both stabilities in the fixture', () => expect(order.slice(0, 2)).toEqual(['stable', 'unstable']));

  it('colours the cell plot, the review overlay and the server figure from the same mapping', () => {
    expect(stabilityScale(branchDiagramSpec(branch, { parameter: 'mu', yVariable: 'x', variables: ['x'], palette: DEFAULT_PALETTE }))).toEqual(expected(DEFAULT_PALETTE));
    expect(stabilityScale(branchOverlaySpec(branch, branch, { parameter: 'mu', yVariable: 'x', palette: DEFAULT_PALETTE }))).toEqual(expected(DEFAULT_PALETTE));
    expect(stabilityScale(branchFigureSpec(branch, { parameter: 'mu', variable: 'x', caption: '' }))).toEqual(expected(PRINT_PALETTE));
  });

  it('draws stable solid and unstable dashed', () => {
    expect(STABILITY_STYLE.stable.dash).toEqual([1, 0]);
    expect(STABILITY_STYLE.unstable.dash.length).toBe(2);
  });
});
