import type { CellKind } from '@shared/cells/kinds.ts';
import type { DocumentCell } from '@shared/editor/document.ts';
import { ENGINE_DEFAULTS } from '@shared/engine/limits.ts';
import { modelSummaries } from './model-ref.ts';

/**
 * The input of a newly added cell. Analysis cells use the last model cell of the entry and start
 * from settings that fit it: its first parameter, a range around that parameter's value, zeros
 * for unknown starting values.
 */
export function defaultCellInput(kind: CellKind, cells: readonly DocumentCell[]): Record<string, unknown> {
  if (kind === 'model') {
    const n = cells.filter((c) => c.kind === 'model').length + 1;
    return {
      name: n === 1 ? 'Model' : `Model ${n}`,
      variables: [{ name: 'x', rhs: '' }],
      parameters: [],
      definitions: [],
    };
  }
  const models = modelSummaries(cells);
  const model = models[models.length - 1];
  const modelCellId = model?.id ?? '';
  const p0 = model?.parameters[0];
  const p1 = model?.parameters[1];
  const around = (v: number | undefined): [number, number] => {
    const c = v ?? 0;
    const w = Math.max(1, Math.abs(c));
    return [c - w, c + w];
  };
  switch (kind) {
    case 'equilibria':
      return { modelCellId, task: { kind: 'equilibria', box: {}, starts: ENGINE_DEFAULTS.starts } };
    case 'branch': {
      const [min, max] = around(p0?.value);
      return {
        modelCellId,
        task: {
          kind: 'continuation',
          parameter: p0?.name ?? '',
          start: {},
          bounds: { min, max },
          maxPoints: ENGINE_DEFAULTS.maxPoints,
          direction: 'both',
        },
        view: { yVariable: model?.variables[0] },
      };
    }
    case 'fold-map': {
      const bounds: Record<string, [number, number]> = {};
      const start: Record<string, number> = {};
      for (const p of [p0, p1]) {
        if (!p) continue;
        bounds[p.name] = around(p.value);
        start[p.name] = p.value ?? 0;
      }
      return {
        modelCellId,
        task: {
          kind: 'fold-curve',
          parameters: [p0?.name ?? '', p1?.name ?? ''],
          start: { parameters: start, state: {} },
          bounds,
          maxPoints: ENGINE_DEFAULTS.maxPoints,
          direction: 'both',
        },
      };
    }
    case 'trajectory':
      return {
        modelCellId,
        task: {
          kind: 'simulate',
          initial: {},
          time: { start: 0, end: 10, samples: ENGINE_DEFAULTS.samples },
        },
        view: { phaseX: model?.variables[0], phaseY: model?.variables[1] },
      };
  }
}
