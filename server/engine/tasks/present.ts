import { ENGINE_ERROR_CODES, type Point, type Values } from '@shared/engine/contract.ts';
import type { Tolerances } from '../defaults.ts';
import { EngineRequestError } from '../errors.ts';
import { stabilityOf } from '../bifurcation/stability.ts';
import { norm2 } from '../linalg/vector.ts';
import type { CompiledModel } from '../model/compile.ts';

/** { name: value } from an array in slot order. */
export function named(names: readonly string[], values: ArrayLike<number>, offset = 0): Values {
  const out: Values = {};
  names.forEach((name, i) => (out[name] = values[offset + i] + 0));
  return out;
}

/**
 * A vector in slot order from { name: value }; names left out take `fallback[i]` (or 0).
 * A name the model does not have is a request error at `path`.
 */
export function vectorFrom(names: readonly string[], values: Values, path: string, what: string, fallback?: ArrayLike<number>): Float64Array {
  const out = new Float64Array(names.length);
  names.forEach((name, i) => (out[i] = name in values ? values[name] : (fallback?.[i] ?? 0)));
  for (const key of Object.keys(values))
    if (!names.includes(key))
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.unknownReference, message: `"${key}" is not a ${what} of the model`, path: `${path}.${key}` });
  return out;
}

/** Index of a parameter by name, or a request error at `path`. */
export function parameterIndex(model: CompiledModel, name: string, path: string): number {
  const k = model.parameters.indexOf(name);
  if (k < 0)
    throw new EngineRequestError({
      code: ENGINE_ERROR_CODES.unknownReference,
      message: model.parameters.length
        ? `"${name}" is not a parameter of the model (parameters: ${model.parameters.join(', ')})`
        : `"${name}" is not a parameter: the model has no parameters`,
      path,
    });
  return k;
}

/** An equilibrium with its stability from the Jacobian's eigenvalues. */
export function equilibriumPoint(model: CompiledModel, x: Float64Array, p: Float64Array, tol: Tolerances, residual?: number): Point {
  const n = model.n;
  const jac = new Float64Array(n * n);
  model.jacobian(x, p, jac);
  let r = residual;
  if (r === undefined) {
    const f = new Float64Array(n);
    model.rhs(x, p, f);
    r = norm2(f);
  }
  return { state: named(model.variables, x), ...stabilityOf(jac, n, tol), residual: r };
}
