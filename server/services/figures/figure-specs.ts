import type { TopLevelSpec } from 'vega-lite';
import { FIGURE_LIMITS } from '@shared/api/figures.ts';
import type { ContinuationResult, FoldCurveResult, SimulateResult } from '@shared/engine/contract.ts';
import { branchDiagramSpec, type MeasurementOverlay } from '@shared/plots/branch-diagram-spec.ts';
import { foldMapSpec } from '@shared/plots/fold-map-spec.ts';
import { PRINT_PALETTE } from '@shared/plots/plot-style.ts';
import { timeSeriesSpec } from '@shared/plots/trajectory-spec.ts';

/**
 * Server-rendered figures use the very plot specs of the cells (`shared/plots/`), in the print
 * palette (light colours on white, a font every machine has) at a fixed size, with the caption as
 * the title. Hover layers are inert in a static image.
 */
export type { MeasurementOverlay };

const size = { width: FIGURE_LIMITS.width, height: FIGURE_LIMITS.height };

const titled = (spec: TopLevelSpec, caption: string): TopLevelSpec => (caption ? ({ ...spec, title: caption } as TopLevelSpec) : spec);

/** Parameter against one state variable along the branch, by stability, folds and other events marked; measured data over it. */
export function branchFigureSpec(
  result: ContinuationResult,
  props: { parameter: string; variable: string; caption: string; measurements?: MeasurementOverlay[] },
): TopLevelSpec {
  const variables = Object.keys(result.branch.points[0]?.state ?? {});
  const spec = branchDiagramSpec(result, { parameter: props.parameter, yVariable: props.variable, variables, palette: PRINT_PALETTE, measurements: props.measurements, ...size });
  return titled(spec, props.caption);
}

/** The fold curve in the plane of two parameters, with cusps marked and the bistable region shaded. */
export function foldMapFigureSpec(result: FoldCurveResult, props: { parameters: readonly [string, string]; caption: string }): TopLevelSpec {
  return titled(foldMapSpec(result, props.parameters, { palette: PRINT_PALETTE, ...size }), props.caption);
}

/** Each state variable against time. */
export function trajectoryFigureSpec(result: SimulateResult, props: { caption: string }): TopLevelSpec {
  return titled(timeSeriesSpec(result, Object.keys(result.trajectory.state), { palette: PRINT_PALETTE, ...size }), props.caption);
}
