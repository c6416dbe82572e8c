import type { TippingMargin } from '@shared/engine/contract.ts';

/**
 * Tipping margins along a branch: for each point, how far the parameter may increase and
 * decrease, staying on the branch, before the nearest fold that way. Between two consecutive
 * folds the parameter is monotone along the branch, so the folds bounding a point's stretch are
 * the nearest ones in each direction (common practice). `folds` are { after, parameter } in
 * branch order (`after`: index of the point just before the fold). null: no fold that way.
 */
export function tippingMargins(parameters: readonly number[], folds: ReadonlyArray<{ after: number; parameter: number }>): TippingMargin[] {
  return parameters.map((mu, i) => {
    let increasing: number | null = null;
    let decreasing: number | null = null;
    const behind = [...folds].reverse().find((f) => f.after < i);
    const ahead = folds.find((f) => f.after >= i);
    for (const fold of [behind, ahead]) {
      if (!fold) continue;
      const d = fold.parameter - mu;
      if (d >= 0) increasing = increasing === null ? d : Math.min(increasing, d);
      else decreasing = decreasing === null ? -d : Math.min(decreasing, -d);
    }
    return { increasing, decreasing };
  });
}
