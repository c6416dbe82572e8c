import { DEFAULT_PALETTE, type PlotPalette } from '@shared/plots/plot-style.ts';

/** The plot colours of the page's current theme, read from the shell's CSS variables. */
export function readPlotPalette(el: Element = document.documentElement): PlotPalette {
  const css = getComputedStyle(el);
  const v = (name: string, fallback: string) => css.getPropertyValue(name).trim() || fallback;
  const d = DEFAULT_PALETTE;
  return {
    ink: v('--bf-ink', d.ink),
    muted: v('--bf-ink-muted', d.muted),
    rule: v('--bf-rule', d.rule),
    surface: v('--bf-surface', d.surface),
    stable: v('--bf-stable', d.stable),
    unstable: v('--bf-unstable', d.unstable),
    accent: v('--bf-accent', d.accent),
    warning: v('--bf-warning', d.warning),
    flowUp: v('--bf-accent-soft', d.flowUp),
    flowDown: v('--bf-warning-soft', d.flowDown),
    region: v('--bf-accent-soft', d.region),
    series: [
      v('--bf-stable', d.series[0]),
      v('--bf-unstable', d.series[1]),
      v('--bf-accent', d.series[2]),
      v('--bf-warning', d.series[3]),
      d.series[4],
      v('--bf-success', d.series[5]),
    ],
    measured: v('--bf-success', d.measured ?? d.series[5]),
  };
}
