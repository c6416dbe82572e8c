import type { MeasurementSet } from '@shared/api/measurements.ts';

/**
 * Vega-lite layers that draw measured data (points with error bars) over a plot whose x field is
 * `parameter` and y field is `y` (the branch diagram's fields). Add them to the diagram's `layer`.
 */
export function measurementLayers(sets: readonly MeasurementSet[], colour = '#047857'): object[] {
  const values = sets.flatMap((s) =>
    s.rows.map((r) => ({ set: s.name, parameter: r.parameter, y: r.value, low: r.value - (r.errorLow ?? 0), high: r.value + (r.errorHigh ?? 0) })),
  );
  if (values.length === 0) return [];
  const x = { field: 'parameter', type: 'quantitative' };
  return [
    { data: { values }, mark: { type: 'rule', color: colour }, encoding: { x, y: { field: 'low', type: 'quantitative' }, y2: { field: 'high' } } },
    {
      data: { values },
      mark: { type: 'point', shape: 'diamond', filled: true, size: 45, color: colour },
      encoding: { x, y: { field: 'y', type: 'quantitative' }, tooltip: [{ field: 'set', title: 'Data set' }, { field: 'parameter', title: 'Parameter' }, { field: 'y', title: 'Observed' }] },
    },
  ];
}

/** Adds measured-data layers to a layered vega-lite spec (a spec without `layer` is returned as it is). */
export function withMeasurements<S extends { layer?: object[] }>(spec: S, sets: readonly MeasurementSet[]): S {
  if (!spec.layer || sets.length === 0) return spec;
  return { ...spec, layer: [...spec.layer, ...measurementLayers(sets)] };
}
