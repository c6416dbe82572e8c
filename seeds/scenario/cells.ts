import type { ModelCellInput } from '@shared/cells/inputs.ts';
import type { DocNode, DocumentCell } from '@shared/editor/document.ts';
import type { Values } from '@shared/engine/contract.ts';
import { cellNode } from './doc.ts';

/** Cell inputs of the demo entries, as the editor's cell forms would save them. */

export const place = (cell: DocumentCell): DocNode => cellNode(cell.id, cell.kind, cell.input);

export const modelCell = (id: string, input: ModelCellInput): DocumentCell => ({
  id,
  kind: 'model',
  input: input as Record<string, unknown>,
});

export const equilibriaCell = (
  id: string,
  modelCellId: string,
  box: Record<string, [number, number]>,
): DocumentCell => ({
  id,
  kind: 'equilibria',
  input: { modelCellId, task: { kind: 'equilibria', box, starts: 64 } },
});

export const branchCell = (
  id: string,
  modelCellId: string,
  props: { parameter: string; start: Values; bounds: [number, number]; yVariable: string },
): DocumentCell => ({
  id,
  kind: 'branch',
  input: {
    modelCellId,
    task: {
      kind: 'continuation',
      parameter: props.parameter,
      start: props.start,
      bounds: { min: props.bounds[0], max: props.bounds[1] },
      maxPoints: 400,
    },
    view: { yVariable: props.yVariable },
  },
});

export const foldMapCell = (
  id: string,
  modelCellId: string,
  props: {
    parameters: [string, string];
    start: { parameters: Values; state: Values };
    bounds: Record<string, [number, number]>;
  },
): DocumentCell => ({
  id,
  kind: 'fold-map',
  input: { modelCellId, task: { kind: 'fold-curve', ...props, maxPoints: 600 } },
});

export const trajectoryCell = (
  id: string,
  modelCellId: string,
  props: { initial: Values; end: number; phase?: [string, string] },
): DocumentCell => ({
  id,
  kind: 'trajectory',
  input: {
    modelCellId,
    task: { kind: 'simulate', initial: props.initial, time: { start: 0, end: props.end, samples: 401 } },
    ...(props.phase ? { view: { phaseX: props.phase[0], phaseY: props.phase[1] } } : {}),
  },
});
