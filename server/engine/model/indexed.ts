import { parse as mathParse, SymbolNode, ConstantNode, type MathNode } from 'mathjs';
import { ENGINE_ERROR_CODES, type EngineFieldError, type Model } from '@shared/engine/contract.ts';
import { ENGINE_LIMITS } from '@shared/engine/limits.ts';

/** A model with its indexed variables written out as scalar ones. */
export interface ExpandedModel {
  model: Model;
  /** Result names of the state entries ("u[3]" for entries of indexed variables). */
  displayNames: string[];
  /** Index in the request's `model.variables` of each written-out variable (for error paths). */
  origin: number[];
}

/** Internal scalar name of entry k of indexed variable `name` (never shown). */
const entryName = (name: string, k: number) => `${name}__${k}`;

class IndexProblem extends Error {
  constructor(readonly error: EngineFieldError) {
    super(error.message);
  }
}

/**
 * Write out indexed variables: for u with size N, the variables u[1] … u[N] with the rhs
 * evaluated at i = 1 … N; u[j] with j from its index expression (an integer once i is known),
 * u[0] and u[N + 1] the boundary expressions. Scalar variables and definitions may use entries
 * at constant indices. A model without indexed variables is returned unchanged. Errors name
 * the field (model.variables[j].rhs) and say what is wrong.
 */
export function expandIndexed(model: Model): { expanded?: ExpandedModel; errors: EngineFieldError[] } {
  const indexed = new Map<string, { size: number; left: string; right: string; at: number }>();
  model.variables.forEach((v, j) => {
    if (v.size !== undefined) indexed.set(v.name, { size: v.size, left: v.boundary?.left ?? '0', right: v.boundary?.right ?? '0', at: j });
  });
  if (indexed.size === 0)
    return { expanded: { model, displayNames: model.variables.map((v) => v.name), origin: model.variables.map((_, j) => j) }, errors: [] };
  const errors: EngineFieldError[] = [];
  const total = model.variables.reduce((s, v) => s + (v.size ?? 1), 0);
  if (total > ENGINE_LIMITS.stateMax)
    return { errors: [{ code: ENGINE_ERROR_CODES.invalidRequest, message: `The model has ${total} state entries once indexed variables are written out; at most ${ENGINE_LIMITS.stateMax}`, path: 'model.variables' }] };
  const userNames = new Set([...model.variables.map((v) => v.name), ...model.parameters.map((p) => p.name), ...model.definitions.map((d) => d.name)]);
  for (const [name, info] of indexed)
    for (const other of userNames)
      if (other.startsWith(`${name}__`))
        errors.push({ code: ENGINE_ERROR_CODES.duplicateName, message: `"${other}" clashes with the entries of the indexed variable ${name}: choose another name`, path: `model.variables[${info.at}].name` });
  if (errors.length) return { errors };

  const boundaryTrees = new Map<string, { left: MathNode; right: MathNode }>();
  for (const [name, info] of indexed) {
    const tree = (text: string, side: 'left' | 'right') => {
      try {
        return mathParse(text);
      } catch (e) {
        errors.push({ code: ENGINE_ERROR_CODES.syntax, message: `Syntax error: ${e instanceof Error ? e.message : String(e)}`, path: `model.variables[${info.at}].boundary.${side}` });
        return new ConstantNode(0);
      }
    };
    boundaryTrees.set(name, { left: tree(info.left, 'left'), right: tree(info.right, 'right') });
  }

  /** The expression with indices resolved, for i = `at` (null: `i` is not available). */
  const resolve = (root: MathNode, at: number | null, path: string): string => {
    const out = root.transform((node: MathNode) => {
      if (node.type === 'AccessorNode' || node.type === 'IndexNode') {
        const acc = node as unknown as { object?: MathNode; index?: { dimensions: MathNode[] } };
        const object = acc.object;
        if (!object || object.type !== 'SymbolNode' || !indexed.has((object as unknown as { name: string }).name))
          throw new IndexProblem({ code: ENGINE_ERROR_CODES.forbiddenSyntax, message: 'Indexing is only for indexed variables (those with a size), e.g. u[i-1]', path, position: 0 });
        const name = (object as unknown as { name: string }).name;
        const dims = acc.index?.dimensions ?? [];
        if (dims.length !== 1) throw new IndexProblem({ code: ENGINE_ERROR_CODES.forbiddenSyntax, message: `${name} takes one index, e.g. ${name}[i]`, path, position: 0 });
        let j: unknown;
        try {
          j = dims[0].evaluate(at === null ? {} : { i: at });
        } catch {
          throw new IndexProblem({ code: ENGINE_ERROR_CODES.forbiddenSyntax, message: at === null ? `The index of ${name} must be a number here (i is only known in the rhs of an indexed variable)` : `The index of ${name} must be a whole-number expression in i`, path, position: 0 });
        }
        const info = indexed.get(name)!;
        if (typeof j !== 'number' || !Number.isInteger(j))
          throw new IndexProblem({ code: ENGINE_ERROR_CODES.forbiddenSyntax, message: `The index of ${name} must be a whole number (got ${String(j)}${at === null ? '' : ` at i = ${at}`})`, path, position: 0 });
        if (j === 0) return boundaryTrees.get(name)!.left;
        if (j === info.size + 1) return boundaryTrees.get(name)!.right;
        if (j < 0 || j > info.size + 1)
          throw new IndexProblem({ code: ENGINE_ERROR_CODES.forbiddenSyntax, message: `${name}[${j}] is outside 0 … ${info.size + 1}${at === null ? '' : ` (at i = ${at})`}: entries are 1 … ${info.size}, 0 and ${info.size + 1} are the boundary values`, path, position: 0 });
        return new SymbolNode(entryName(name, j));
      }
      if (node.type === 'SymbolNode') {
        const name = (node as unknown as { name: string }).name;
        if (name === 'i' && at !== null && !userNames.has('i')) return new ConstantNode(at);
        if (indexed.has(name)) throw new IndexProblem({ code: ENGINE_ERROR_CODES.unknownName, message: `${name} is an indexed variable: write an entry, e.g. ${name}[i] or ${name}[1]`, path, position: 0 });
      }
      return node;
    });
    return out.toString({ parenthesis: 'all' });
  };
  const parseOr = (text: string, path: string): MathNode | null => {
    try {
      return mathParse(text);
    } catch (e) {
      errors.push({ code: ENGINE_ERROR_CODES.syntax, message: `Syntax error: ${e instanceof Error ? e.message.replace(/\s*\(char \d+\)\s*$/, '') : String(e)}`, path, position: 0 });
      return null;
    }
  };
  const variables: Model['variables'] = [];
  const displayNames: string[] = [];
  const origin: number[] = [];
  model.variables.forEach((v, j) => {
    const path = `model.variables[${j}].rhs`;
    const tree = parseOr(v.rhs, path);
    if (!tree) return;
    try {
      if (v.size === undefined) {
        variables.push({ name: v.name, rhs: resolve(tree, null, path) });
        displayNames.push(v.name);
        origin.push(j);
      } else
        for (let k = 1; k <= v.size; k++) {
          variables.push({ name: entryName(v.name, k), rhs: resolve(tree, k, path) });
          displayNames.push(`${v.name}[${k}]`);
          origin.push(j);
        }
    } catch (e) {
      if (!(e instanceof IndexProblem)) throw e;
      errors.push(e.error);
    }
  });
  const definitions = model.definitions.map((d, j) => {
    const path = `model.definitions[${j}].expression`;
    const tree = parseOr(d.expression, path);
    if (!tree) return d;
    try {
      return { name: d.name, expression: resolve(tree, null, path) };
    } catch (e) {
      if (!(e instanceof IndexProblem)) throw e;
      errors.push(e.error);
      return d;
    }
  });
  if (errors.length) return { errors };
  return { expanded: { model: { variables, parameters: model.parameters, definitions }, displayNames, origin }, errors };
}

/** Map a field error of the written-out model back to the request's field. */
export function originalPath(error: EngineFieldError, origin: number[]): EngineFieldError {
  const m = /^model\.variables\[(\d+)\](.*)$/.exec(error.path ?? '');
  if (!m) return error;
  const j = origin[Number(m[1])];
  return { ...error, path: `model.variables[${j}]${m[2]}`, ...(origin.filter((o) => o === j).length > 1 ? { position: undefined } : {}) };
}
