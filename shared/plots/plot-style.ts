/**
 * The look every plot shares: colours, fonts and the helpers the plot-spec builders use. Specs take
 * a palette as data (they are pure): the client reads it from the page's theme
 * (`src/lib/plot-palette.ts`), server-side figures use `PRINT_PALETTE`.
 */
export interface PlotPalette {
  ink: string;
  muted: string;
  rule: string;
  surface: string;
  stable: string;
  unstable: string;
  accent: string;
  warning: string;
  /** Background tint where x' > 0 and where x' < 0 (one-variable branch diagrams). */
  flowUp: string;
  flowDown: string;
  /** Region shading (fold map). */
  region: string;
  /** One colour per series (trajectory variables). */
  series: string[];
  /** Measured data drawn over a result. */
  measured?: string;
  /** Text and label fonts (default: the app's IBM Plex). */
  font?: string;
  monoFont?: string;
  /** Plot background (default: transparent, the page shows through). */
  background?: string;
}

const SANS = 'IBM Plex Sans, system-ui, sans-serif';
const MONO = 'IBM Plex Mono, monospace';

/** Used in tests and when no page is there to read (values of the light theme). */
export const DEFAULT_PALETTE: PlotPalette = {
  ink: '#1c2540',
  muted: '#4d5670',
  rule: '#d8cdb8',
  surface: '#fffdf8',
  stable: '#2f3f9e',
  unstable: '#a8321c',
  accent: '#0e6a70',
  warning: '#7a4e00',
  flowUp: '#dcefee',
  flowDown: '#f7ebcf',
  region: '#dcefee',
  series: ['#2f3f9e', '#a8321c', '#0e6a70', '#7a4e00', '#6b3fa0', '#24663a'],
  measured: '#24663a',
};

/** Figures rendered on the server for print and export: the light theme's colours on white, a font every machine has. */
export const PRINT_PALETTE: PlotPalette = {
  ...DEFAULT_PALETTE,
  surface: '#ffffff',
  rule: '#e3ddd0',
  background: '#ffffff',
  font: 'DejaVu Sans',
  monoFont: 'DejaVu Sans Mono',
};

/** Shared look of every plot: fonts, axes, no chart border. */
export function plotConfig(p: PlotPalette) {
  return {
    font: p.font ?? SANS,
    background: p.background ?? 'transparent',
    view: { stroke: p.rule },
    axis: {
      labelColor: p.muted,
      titleColor: p.ink,
      domainColor: p.muted,
      tickColor: p.muted,
      gridColor: p.rule,
      gridOpacity: 0.6,
      labelFont: p.monoFont ?? MONO,
      labelFontSize: 11,
      titleFont: p.font ?? SANS,
      titleFontSize: 12,
      titleFontWeight: 500,
      // About one label per 60 px on a 900 px plot; overlapping labels are dropped, not crowded.
      tickCount: 10,
      labelOverlap: true,
    },
    legend: {
      labelColor: p.ink,
      titleColor: p.muted,
      labelFontSize: 11,
      orient: 'top' as const,
      direction: 'horizontal' as const,
    },
    text: { color: p.ink },
    title: { color: p.ink, font: p.font ?? SANS, fontSize: 13, anchor: 'start' as const },
  };
}

/** A number for labels: 4 significant digits, no trailing noise. */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const ax = Math.abs(x);
  if (ax >= 1e5 || ax < 1e-3) return x.toExponential(3).replace(/\.?0+e/, 'e');
  return String(Number(x.toPrecision(4)));
}

/** Eigenvalues as text: "−0.52, 0.13 ± 1.2i". */
export function formatEigenvalues(list: readonly { re: number; im: number }[]): string {
  const out: string[] = [];
  for (let i = 0; i < list.length; i++) {
    const { re, im } = list[i];
    if (Math.abs(im) < 1e-12) out.push(formatNumber(re));
    else if (im > 0) out.push(`${formatNumber(re)} ± ${formatNumber(im)}i`);
  }
  return out.join(', ');
}

/** The data range padded by a fraction on each side (a flat range gets ±1). */
export function paddedRange(values: readonly number[], pad = 0.08): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return [0, 1];
  if (hi - lo < 1e-12) return [lo - 1, hi + 1];
  const d = (hi - lo) * pad;
  return [lo - d, hi + d];
}

/** A quantitative position channel with a fixed domain (no rounding, no forced zero). */
export function quantitativeChannel(field: string, title: string, domain: [number, number]) {
  return { field, type: 'quantitative' as const, title, scale: { domain, nice: false, zero: false } };
}

export type Tooltip = { field: string; title: string; number?: boolean };

/** Invisible points that carry the hover details of a line (lines themselves make poor hover targets). */
export function hoverLayer(values: object[], x: object, y: object, tooltip: Tooltip[]) {
  return {
    name: 'hover',
    data: { values },
    mark: { type: 'point', opacity: 0, size: 60, filled: true },
    encoding: {
      x,
      y,
      tooltip: tooltip.map((t) =>
        t.number
          ? { field: t.field, type: 'quantitative', title: t.title, format: '.5~g' }
          : { field: t.field, type: 'nominal', title: t.title },
      ),
    },
  };
}

/** A layered plot with the house look. */
export function layeredPlot(
  p: PlotPalette,
  layers: object[],
  size: { width?: number | 'container'; height?: number },
  extra: object = {},
) {
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: size.width ?? 'container',
    height: size.height ?? 340,
    config: plotConfig(p),
    layer: layers,
    ...extra,
  };
}

/** The font of labels drawn as text marks. */
export const labelFont = (p: PlotPalette): string => p.font ?? SANS;
