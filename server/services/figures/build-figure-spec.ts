import type { TopLevelSpec } from 'vega-lite';
import { FIGURE_CELL_KINDS } from '@shared/api/figures.ts';
import { checkCellInput } from '@shared/cells/inputs.ts';
import { resultFor, type CellOutput } from '@shared/cells/output.ts';
import type { DocumentCell } from '@shared/editor/document.ts';
import { branchFigureSpec, foldMapFigureSpec, trajectoryFigureSpec, type MeasurementOverlay } from './figure-specs.ts';
import { NotPlottableError } from './figure-errors.ts';

export type FigureCellKind = (typeof FIGURE_CELL_KINDS)[number];

/** The plot specification of a cell's stored output, or NotPlottableError saying why there is none. */
export function buildFigureSpec(
  cell: DocumentCell,
  output: CellOutput | undefined,
  props: { caption: string; variable?: string; measurements: MeasurementOverlay[] },
): { kind: FigureCellKind; spec: TopLevelSpec } {
  if (!(FIGURE_CELL_KINDS as readonly string[]).includes(cell.kind)) {
    throw new NotPlottableError(`A ${cell.kind} cell has no plot to attach; choose a branch, fold map or trajectory cell`);
  }
  const kind = cell.kind as FigureCellKind;
  if (!output) throw new NotPlottableError('This cell has no result in this revision: run it and record the revision first');
  if (output.status !== 'ok') throw new NotPlottableError('This cell’s last run failed, so there is nothing to draw');
  const input = checkCellInput(kind, cell.input);
  if (!input.ok) throw new NotPlottableError('This cell’s settings are not valid, so its plot cannot be drawn');
  if (kind === 'branch') {
    const result = resultFor('branch', output);
    const parsed = input.value as { task: { parameter: string }; view?: { yVariable?: string } };
    if (!result) throw new NotPlottableError('This cell’s stored result is not a branch');
    const names = Object.keys(result.branch.points[0]?.state ?? {});
    const variable = props.variable ?? parsed.view?.yVariable ?? names[0];
    if (!variable || !names.includes(variable)) {
      throw new NotPlottableError(`"${variable ?? ''}" is not a state variable of this branch (variables: ${names.join(', ')})`, 'variable');
    }
    return { kind, spec: branchFigureSpec(result, { parameter: parsed.task.parameter, variable, caption: props.caption, measurements: props.measurements }) };
  }
  if (kind === 'fold-map') {
    const result = resultFor('fold-map', output);
    const parsed = input.value as { task: { parameters: [string, string] } };
    if (!result) throw new NotPlottableError('This cell’s stored result is not a fold curve');
    return { kind, spec: foldMapFigureSpec(result, { parameters: parsed.task.parameters, caption: props.caption }) };
  }
  const result = resultFor('trajectory', output);
  if (!result) throw new NotPlottableError('This cell’s stored result is not a trajectory');
  return { kind, spec: trajectoryFigureSpec(result, { caption: props.caption }) };
}
