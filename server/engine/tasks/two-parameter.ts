import { ENGINE_ERROR_CODES, type FoldCurveTask, type HopfCurveTask } from '@shared/engine/contract.ts';
import { ENGINE_LIMITS } from '@shared/engine/limits.ts';
import { EngineRequestError } from '../errors.ts';
import type { CompiledModel } from '../model/compile.ts';
import { parameterIndex, vectorFrom } from './present.ts';

/**
 * The common checks of a two-parameter curve task (fold or Hopf curve): both parameters exist,
 * bounds are given for exactly those two, and the start lies inside them. Returns the parameter
 * indices and the start's parameter vector.
 */
export function twoParameterSetup(model: CompiledModel, task: FoldCurveTask | HopfCurveTask) {
  if (model.n > ENGINE_LIMITS.curveStateMax)
    throw new EngineRequestError({
      code: ENGINE_ERROR_CODES.invalidRequest,
      message: `${task.kind === 'fold-curve' ? 'Fold' : 'Hopf'} curves are computed for models with at most ${ENGINE_LIMITS.curveStateMax} state entries; this one has ${model.n}`,
      path: 'model.variables',
    });
  const [name1, name2] = task.parameters;
  const k1 = parameterIndex(model, name1, 'task.parameters[0]');
  const k2 = parameterIndex(model, name2, 'task.parameters[1]');
  for (const key of Object.keys(task.bounds))
    if (key !== name1 && key !== name2)
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.unknownReference, message: `"${key}" is not one of the two continued parameters (${name1}, ${name2})`, path: `task.bounds.${key}` });
  for (const name of task.parameters)
    if (!task.bounds[name])
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: `Give bounds for ${name}, e.g. "${name}": [-1, 1]`, path: `task.bounds.${name}` });
  const p = vectorFrom(model.parameters, task.start.parameters, 'task.start.parameters', 'parameter', model.parameterValues());
  for (const [k, name] of [[k1, name1], [k2, name2]] as const) {
    const [lo, hi] = task.bounds[name];
    if (p[k] < lo || p[k] > hi)
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: `The start value of ${name} (${p[k]}) lies outside its bounds [${lo}, ${hi}]`, path: `task.bounds.${name}` });
  }
  return { k1, k2, p, names: [name1, name2] as const };
}
