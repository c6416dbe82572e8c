import { Resvg } from '@resvg/resvg-js';
import * as vega from 'vega';
import * as vl from 'vega-lite';
import type { TopLevelSpec } from 'vega-lite';
import { FIGURE_LIMITS } from '@shared/api/figures.ts';

export interface RenderedFigure {
  svg: string;
  png: Buffer;
  width: number;
  height: number;
}

/**
 * Renders a vega-lite specification in Node: vega-lite → vega → SVG with vega's headless view
 * (no canvas), then the SVG → PNG with resvg at FIGURE_LIMITS.pngScale, using the system's
 * DejaVu fonts so text is drawn the same everywhere.
 */
export async function renderFigure(spec: TopLevelSpec): Promise<RenderedFigure> {
  const compiled = vl.compile(spec).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none' });
  try {
    const svg = await view.toSVG();
    const resvg = new Resvg(svg, {
      fitTo: { mode: 'zoom', value: FIGURE_LIMITS.pngScale },
      font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' },
      background: '#ffffff',
    });
    const image = resvg.render();
    return { svg, png: image.asPng(), width: image.width, height: image.height };
  } finally {
    view.finalize();
  }
}
