import { useMemo } from 'react';
import type { AnalysisCellKind } from '@shared/cells/kinds.ts';
import { resultFor, type CellOutput } from '@shared/cells/output.ts';
import { LazyPlot } from '@/features/cells/components/lazy-plot.tsx';
import { readPlotPalette } from '@/lib/plot-palette.ts';
import { branchOverlaySpec, foldCurveOverlaySpec, trajectoryOverlaySpec } from '@shared/plots/overlay-spec.ts';

/** The plots of both revisions of one cell in one frame: the older faint, the newer strong. */
export function OverlayPlot({
  kind,
  older,
  newer,
  input,
  title,
}: {
  kind: AnalysisCellKind;
  older: CellOutput | undefined;
  newer: CellOutput | undefined;
  input: Record<string, unknown>;
  title: string;
}) {
  const spec = useMemo(() => {
    const palette = readPlotPalette();
    const task = (input.task ?? {}) as Record<string, unknown>;
    if (kind === 'branch') {
      const a = resultFor('branch', older);
      const b = resultFor('branch', newer);
      const sample = (b ?? a)?.branch.points[0]?.state ?? {};
      const view = (input.view ?? {}) as { yVariable?: string };
      const yVariable = view.yVariable && view.yVariable in sample ? view.yVariable : Object.keys(sample)[0];
      if ((!a && !b) || !yVariable) return null;
      return branchOverlaySpec(a, b, { parameter: String(task.parameter ?? 'parameter'), yVariable, palette });
    }
    if (kind === 'fold-map') {
      const a = resultFor('fold-map', older);
      const b = resultFor('fold-map', newer);
      const params = Array.isArray(task.parameters) && task.parameters.length === 2 ? ([String(task.parameters[0]), String(task.parameters[1])] as const) : null;
      if ((!a && !b) || !params) return null;
      return foldCurveOverlaySpec(a, b, params, palette);
    }
    if (kind === 'trajectory') {
      const a = resultFor('trajectory', older);
      const b = resultFor('trajectory', newer);
      if (!a && !b) return null;
      return trajectoryOverlaySpec(a, b, palette);
    }
    return null;
  }, [kind, older, newer, input]);
  if (!spec) return null;
  return (
    <figure className="mt-3" data-testid="overlay-plot">
      <LazyPlot spec={spec} label={`${title}: the older revision faint and dashed, the newer strong`} height={300} />
      <figcaption className="mt-1 text-xs text-ink-muted">Faint, dashed: the older revision. Strong, solid: the newer one. Diamonds mark events (folds and other points), triangles cusps.</figcaption>
    </figure>
  );
}
