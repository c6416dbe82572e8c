import { ENGINE_ERROR_CODES, type Model } from '@shared/engine/contract.ts';
import { EngineRequestError } from '../errors.ts';
import { buildFunction, emitExpression } from './codegen.ts';
import { expandDefinitions, isZero, partialDerivative } from './derive.ts';
import { num, symbolsOf, type Node } from './nodes.ts';
import { expandIndexed, originalPath } from './indexed.ts';
import { parameterSymbol, parseModel, variableSymbol, type ParsedModel } from './parse.ts';

export type VectorFunction = (x: Float64Array, p: Float64Array, out: Float64Array) => void;
export type MatrixFunction = (x: Float64Array, p: Float64Array, out: Float64Array) => void;
export type HessianTimes = (x: Float64Array, p: Float64Array, v: Float64Array, out: Float64Array) => void;

/**
 * A model compiled to plain JS over Float64Array. Matrices are dense, row-major, n×n.
 * Derivatives are exact (symbolic); those only some tasks need are generated on first use.
 */
export interface CompiledModel {
  readonly n: number;
  readonly variables: readonly string[];
  readonly parameters: readonly string[];
  /** The model's parameter values (a fresh copy per call). */
  parameterValues(): Float64Array;
  /** out[i] = f_i(x, p). */
  readonly rhs: VectorFunction;
  /** out[i·n + j] = ∂f_i/∂x_j. */
  readonly jacobian: MatrixFunction;
  /** out[i] = ∂f_i/∂p_k. */
  parameterDerivative(k: number): VectorFunction;
  /** out[i·n + j] = ∂²f_i/∂x_j∂p_k. */
  jacobianParameterDerivative(k: number): MatrixFunction;
  /** out[i·n + k] = Σ_j ∂²f_i/∂x_j∂x_k · v_j, i.e. the matrix D²f(v, ·). */
  readonly hessianTimes: HessianTimes;
  /** Structural band of the Jacobian: ∂f_i/∂x_j is identically zero unless −kl ≤ j − i ≤ ku. */
  readonly jacobianBand: { kl: number; ku: number };
}

const vectorBody = (n: number, entries: Node[], prefix = ''): string => {
  const lines = [prefix];
  for (let i = 0; i < n; i++) lines.push(`out[${i}]=${isZero(entries[i]) ? '0' : emitExpression(entries[i])};`);
  return lines.join('\n');
};

/** Body assigning a sparse n×m matrix: zero fill, then the non-zero entries. */
const matrixBody = (size: number, entries: Array<{ index: number; node: Node }>): string => {
  const lines = entries.length < size ? ['out.fill(0);'] : [];
  for (const { index, node } of entries) lines.push(`out[${index}]=${emitExpression(node)};`);
  return lines.join('\n');
};

/** Compile an already validated model (see parseModel). */
export function compileParsedModel(parsed: ParsedModel): CompiledModel {
  const n = parsed.variables.length;
  const expanded = expandDefinitions(parsed.definitionTrees, parsed.rhsTrees);
  if (!expanded)
    throw new EngineRequestError({
      code: ENGINE_ERROR_CODES.invalidRequest,
      message: 'The model is too large once its definitions are written out: use fewer nested definitions',
      path: 'model.definitions',
    });
  const definitionLines = parsed.definitionTrees.map((d, j) => `const d_${j}=${emitExpression(d)};`).join('\n');
  const rhs = buildFunction<VectorFunction>(['x', 'p', 'out'], vectorBody(n, parsed.rhsTrees, definitionLines));

  const deps = expanded.map((t) => symbolsOf(t));
  const jacobianNodes: Node[][] = expanded.map((t, i) =>
    Array.from({ length: n }, (_, j) => (deps[i].has(variableSymbol(j)) ? partialDerivative(t, variableSymbol(j)) : (null as unknown as Node))),
  );
  const jacobianEntries: Array<{ index: number; node: Node }> = [];
  jacobianNodes.forEach((row, i) => row.forEach((node, j) => node && !isZero(node) && jacobianEntries.push({ index: i * n + j, node })));
  const jacobian = buildFunction<MatrixFunction>(['x', 'p', 'out'], matrixBody(n * n, jacobianEntries));

  const byParameter = new Map<number, VectorFunction>();
  const jacobianByParameter = new Map<number, MatrixFunction>();
  let hessian: HessianTimes | null = null;

  let kl = 0;
  let ku = 0;
  for (const { index } of jacobianEntries) {
    const i = Math.floor(index / n);
    const j = index % n;
    kl = Math.max(kl, i - j);
    ku = Math.max(ku, j - i);
  }
  return {
    n,
    jacobianBand: { kl, ku },
    variables: parsed.variables,
    parameters: parsed.parameters,
    parameterValues: () => Float64Array.from(parsed.parameterValues),
    rhs,
    jacobian,
    parameterDerivative(k) {
      let f = byParameter.get(k);
      if (!f) {
        const s = parameterSymbol(k);
        const entries = expanded.map((t, i) => (deps[i].has(s) ? partialDerivative(t, s) : num(0)));
        f = buildFunction<VectorFunction>(['x', 'p', 'out'], vectorBody(n, entries));
        byParameter.set(k, f);
      }
      return f;
    },
    jacobianParameterDerivative(k) {
      let f = jacobianByParameter.get(k);
      if (!f) {
        const s = parameterSymbol(k);
        const entries: Array<{ index: number; node: Node }> = [];
        jacobianEntries.forEach(({ index, node }) => {
          const d = partialDerivative(node, s);
          if (!isZero(d)) entries.push({ index, node: d });
        });
        f = buildFunction<MatrixFunction>(['x', 'p', 'out'], matrixBody(n * n, entries));
        jacobianByParameter.set(k, f);
      }
      return f;
    },
    get hessianTimes(): HessianTimes {
      if (!hessian && secondDerivativeCount(jacobianEntries) > SECOND_DERIVATIVES_MAX) hessian = differencedHessianTimes(n, jacobian);
      if (!hessian) {
        // out[i·n + k] = Σ_j H_ijk v_j, with H_ijk = ∂(∂f_i/∂x_j)/∂x_k.
        const terms = new Map<number, string[]>();
        for (const { index, node } of jacobianEntries) {
          const i = Math.floor(index / n);
          const j = index % n;
          for (const s of symbolsOf(node)) {
            const m = /^x_(\d+)$/.exec(s);
            if (!m) continue;
            const k = Number(m[1]);
            const h = partialDerivative(node, s);
            if (isZero(h)) continue;
            const key = i * n + k;
            if (!terms.has(key)) terms.set(key, []);
            terms.get(key)!.push(`${emitExpression(h)}*v[${j}]`);
          }
        }
        const lines = terms.size < n * n ? ['out.fill(0);'] : [];
        for (const [key, list] of terms) lines.push(`out[${key}]=${list.join('+')};`);
        hessian = buildFunction<HessianTimes>(['x', 'p', 'v', 'out'], lines.join('\n'));
      }
      return hessian;
    },
  };
}

/**
 * Largest number of symbolic second derivatives formed for D²f(v, ·). Beyond it (large dense
 * models, where forming them would take minutes) D²f(v, ·) is the central difference of the
 * exact Jacobian along v, (J(x + hv) − J(x − hv))/(2h), h = 1e-5·(1 + ‖x‖∞)/‖v‖∞, accurate to
 * about 1e-10 relative (truncation h², rounding ε/h).
 */
export const SECOND_DERIVATIVES_MAX = 200_000;

function secondDerivativeCount(entries: Array<{ node: Node }>): number {
  let count = 0;
  for (const { node } of entries) {
    for (const s of symbolsOf(node)) if (s.startsWith('x_')) count++;
    if (count > SECOND_DERIVATIVES_MAX) break;
  }
  return count;
}

export function differencedHessianTimes(n: number, jacobian: MatrixFunction): HessianTimes {
  const plus = new Float64Array(n * n);
  const minus = new Float64Array(n * n);
  const xp = new Float64Array(n);
  const xm = new Float64Array(n);
  return (x, p, v, out) => {
    let xs = 0;
    let vs = 0;
    for (let i = 0; i < n; i++) {
      xs = Math.max(xs, Math.abs(x[i]));
      vs = Math.max(vs, Math.abs(v[i]));
    }
    if (vs === 0) {
      out.fill(0, 0, n * n);
      return;
    }
    const h = (1e-5 * (1 + xs)) / vs;
    for (let i = 0; i < n; i++) {
      xp[i] = x[i] + h * v[i];
      xm[i] = x[i] - h * v[i];
    }
    jacobian(xp, p, plus);
    jacobian(xm, p, minus);
    for (let i = 0; i < n * n; i++) out[i] = (plus[i] - minus[i]) / (2 * h);
  };
}

const cache = new Map<string, CompiledModel>();
const CACHE_SIZE = 32;

/**
 * Validate and compile a model. Throws EngineRequestError (with the first field error and the
 * full list in `fields`) when the model is not valid. Recently compiled models are reused.
 */
export function compileModel(model: Model): CompiledModel {
  const key = JSON.stringify({ v: model.variables, p: model.parameters.map((p) => p.name), d: model.definitions });
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return withValues(hit, model);
  }
  const { expanded, errors: indexErrors } = expandIndexed(model);
  if (!expanded) throw new EngineRequestError(indexErrors[0] as ConstructorParameters<typeof EngineRequestError>[0], indexErrors);
  const { model: parsed, errors } = parseModel(expanded.model);
  if (!parsed) {
    const mapped = errors.map((e) => originalPath(e, expanded.origin));
    throw new EngineRequestError(mapped[0] as ConstructorParameters<typeof EngineRequestError>[0], mapped);
  }
  const inner = compileParsedModel(parsed);
  // Indexed entries are presented as "u[3]".
  const compiled = expanded.model === model ? inner : (Object.create(inner, { variables: { value: expanded.displayNames } }) as CompiledModel);
  cache.set(key, compiled);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return withValues(compiled, model);
}

/** The same compiled functions with this request's parameter values. */
function withValues(compiled: CompiledModel, model: Model): CompiledModel {
  const values = Float64Array.from(model.parameters.map((p) => p.value));
  return Object.create(compiled, { parameterValues: { value: () => Float64Array.from(values) } }) as CompiledModel;
}
