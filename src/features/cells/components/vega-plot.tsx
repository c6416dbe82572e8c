import { useRef } from 'react';
import { VegaEmbed } from 'react-vega';
import type { Result, VisualizationSpec } from 'vega-embed';
import { expressionInterpreter } from 'vega-interpreter';

export type PlotClick = (datum: Record<string, unknown>) => void;

/**
 * The vega renderer itself. Expressions run through vega's interpreter instead of generated
 * code, because the app's content security policy forbids eval. Loaded only through LazyPlot, so vega's
 * code is fetched when a plot is on screen.
 */
export default function VegaPlot({
  spec,
  label,
  onClickDatum,
}: {
  spec: VisualizationSpec;
  label: string;
  onClickDatum?: PlotClick;
}) {
  const box = useRef<HTMLDivElement>(null);
  const onEmbed = (result: Result) => {
    // The export menu's toggle has no text of its own.
    box.current
      ?.querySelectorAll('details > summary')
      .forEach((s) => s.setAttribute('aria-label', 'Save the plot as an image'));
    if (!onClickDatum) return;
    result.view.addEventListener('click', (_event, item) => {
      const datum = (item as { datum?: Record<string, unknown> } | null | undefined)?.datum;
      if (datum) onClickDatum(datum);
    });
  };
  return (
    <VegaEmbed
      ref={box}
      aria-label={label}
      className="w-full"
      spec={spec}
      onEmbed={onEmbed}
      options={{
        ast: true,
        expr: expressionInterpreter,
        actions: { export: true, source: false, compiled: false, editor: false },
        renderer: 'svg',
        downloadFileName: label.replace(/[^\w-]+/g, '-').toLowerCase(),
      }}
    />
  );
}
