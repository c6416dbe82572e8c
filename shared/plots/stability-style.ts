import type { Stability } from '../engine/contract.ts';
import type { PlotPalette } from './plot-style.ts';

/** Stability in words, as legends and tooltips say it. */
export const STABILITY_LABEL: Record<Stability, string> = {
  stable: 'stable',
  unstable: 'unstable',
  neutral: 'neutral',
};

/**
 * The one stability style of every plot (cells, review overlays, server figures): stable solid in
 * the stable colour, unstable dashed in the unstable colour; neutral (rare, at the boundary) dotted grey.
 */
export const STABILITY_STYLE: Record<Stability, { color: (p: PlotPalette) => string; dash: number[] }> = {
  stable: { color: (p) => p.stable, dash: [1, 0] },
  unstable: { color: (p) => p.unstable, dash: [6, 4] },
  neutral: { color: (p) => p.muted, dash: [2, 3] },
};

export const STABILITIES: readonly Stability[] = ['stable', 'unstable', 'neutral'];

/** Colour and dash scales over the stabilities present (only those appear in a legend). */
export function stabilityScales(p: PlotPalette, present: readonly Stability[]) {
  const kinds = STABILITIES.filter((k) => present.includes(k));
  return {
    color: { domain: kinds.map((k) => STABILITY_LABEL[k]), range: kinds.map((k) => STABILITY_STYLE[k].color(p)) },
    dash: { domain: kinds.map((k) => STABILITY_LABEL[k]), range: kinds.map((k) => STABILITY_STYLE[k].dash) },
  };
}

/** The colour channel of a line by stability (field `stability` holding the words above). */
export function stabilityColor(p: PlotPalette, present: readonly Stability[], title: string | null) {
  return { field: 'stability', type: 'nominal' as const, title, scale: stabilityScales(p, present).color };
}
