import { parse as mathParse } from 'mathjs';
import { ENGINE_ERROR_CODES, type EngineFieldError, type Model } from '@shared/engine/contract.ts';
import { asConstant, asFunction, asOperator, asSymbol, call, num, op, sym, type Node } from './nodes.ts';

/** Functions an expression may call, with their number of arguments. */
export const ALLOWED_FUNCTIONS: Readonly<Record<string, number>> = {
  exp: 1, log: 1, sqrt: 1, sin: 1, cos: 1, tan: 1, sinh: 1, cosh: 1, tanh: 1,
  asin: 1, acos: 1, atan: 1, abs: 1, pow: 2,
};
/** Named constants an expression may use. */
export const ALLOWED_CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI, e: Math.E };
const ALLOWED_OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus']);
/** Words the expression syntax gives a meaning of its own: they cannot name a quantity. */
const RESERVED = new Set([
  ...Object.keys(ALLOWED_FUNCTIONS), ...Object.keys(ALLOWED_CONSTANTS),
  'mod', 'to', 'in', 'and', 'or', 'xor', 'not', 'end', 'true', 'false', 'null', 'undefined', 'NaN', 'Infinity',
]);

/** Internal symbol names: user names never reach derivatives or generated code. */
export const variableSymbol = (i: number) => `x_${i}`;
export const parameterSymbol = (k: number) => `p_${k}`;
export const definitionSymbol = (j: number) => `d_${j}`;

/**
 * A validated model: user names mapped to slots, each expression a tree over internal
 * symbols (x_i, p_k, d_j) holding only numbers, + - * / ^, unary minus and whitelisted calls.
 */
export interface ParsedModel {
  variables: string[];
  parameters: string[];
  parameterValues: Float64Array;
  definitions: string[];
  /** Definition trees; d_j may refer to d_0 … d_{j−1}. */
  definitionTrees: Node[];
  /** Right-hand sides f_i; may refer to every definition. */
  rhsTrees: Node[];
}

interface Token { text: string; start: number; kind: 'word' | 'number' }

/** Words and numbers of an expression with their positions (for pointing errors at a character). */
function scan(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    if (/[0-9]/.test(c) || (c === '.' && /[0-9]/.test(text[i + 1] ?? ''))) {
      const m = /^(?:0[xob][0-9a-f]+|[0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)/i.exec(text.slice(i))!;
      tokens.push({ text: m[0], start: i, kind: 'number' });
      i += m[0].length;
    } else if (/[A-Za-z_$\u00C0-\uFFFF]/.test(c)) {
      const m = /^[A-Za-z_$\u00C0-\uFFFF][A-Za-z0-9_$\u00C0-\uFFFF]*/.exec(text.slice(i))!;
      tokens.push({ text: m[0], start: i, kind: 'word' });
      i += m[0].length;
    } else i++;
  }
  return tokens;
}

class FieldProblem extends Error {
  constructor(readonly code: EngineFieldError['code'], message: string, readonly position: number) {
    super(message);
  }
}

const STRUCTURE_HINTS: Record<string, { chars: string; message: string }> = {
  AssignmentNode: { chars: '=', message: 'Assignments are not allowed: write only the expression' },
  FunctionAssignmentNode: { chars: '=', message: 'Function definitions are not allowed: use a named definition instead' },
  ArrayNode: { chars: '[', message: 'Matrices and lists are not allowed: expressions are scalar' },
  MatrixNode: { chars: '[', message: 'Matrices and lists are not allowed: expressions are scalar' },
  ObjectNode: { chars: '{', message: 'Objects are not allowed: expressions are scalar' },
  AccessorNode: { chars: '.[', message: 'Property access and indexing are not allowed' },
  IndexNode: { chars: '[', message: 'Indexing is not allowed' },
  ConditionalNode: { chars: '?', message: 'Conditional expressions (a ? b : c) are not allowed' },
  RangeNode: { chars: ':', message: 'Ranges (a:b) are not allowed' },
  BlockNode: { chars: ';\n', message: 'Only one expression is allowed (no ";" or line breaks between expressions)' },
  RelationalNode: { chars: '<>=!', message: 'Comparisons are not allowed' },
};

/**
 * Validate one expression against the whitelist and rewrite it over internal symbols.
 * `names` maps each name the expression may use to its internal node.
 * Throws FieldProblem (code, message, position) on the first problem.
 */
function convertExpression(text: string, names: Map<string, Node>, laterDefinitions: Set<string>): Node {
  let root: Node;
  try {
    root = mathParse(text) as Node;
  } catch (error) {
    const char = (error as { char?: number }).char;
    const position = typeof char === 'number' ? Math.min(Math.max(char - 1, 0), Math.max(text.length - 1, 0)) : 0;
    const message = error instanceof Error ? error.message.replace(/\s*\(char \d+\)\s*$/, '') : 'Syntax error';
    throw new FieldProblem(ENGINE_ERROR_CODES.syntax, `Syntax error: ${message}`, position);
  }
  const tokens = scan(text);
  const seen = new Map<string, number>();
  /** Position of the next occurrence of a word or number, in reading order. */
  const nextPosition = (word: string, kind: Token['kind']): number => {
    const k = seen.get(kind + word) ?? 0;
    seen.set(kind + word, k + 1);
    const matches = tokens.filter((t) => t.kind === kind && t.text === word);
    return (matches[k] ?? matches[0])?.start ?? 0;
  };
  const numberTokens = tokens.filter((t) => t.kind === 'number');
  let numbersSeen = 0;
  const charPosition = (chars: string): number => {
    for (let i = 0; i < text.length; i++) if (chars.includes(text[i])) return i;
    return 0;
  };

  const visit = (node: Node): Node => {
    switch (node.type) {
      case 'ParenthesisNode':
        return visit((node as unknown as { content: Node }).content);
      case 'ConstantNode': {
        const value = asConstant(node).value;
        if (typeof value === 'number') {
          const position = numberTokens[numbersSeen++]?.start ?? 0;
          if (!Number.isFinite(value)) throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, 'This number is too large', position);
          return num(value);
        }
        if (value === undefined) throw new FieldProblem(ENGINE_ERROR_CODES.syntax, 'Enter an expression', 0);
        if (typeof value === 'string')
          throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, 'Text strings are not allowed: expressions are numeric', charPosition('"\''));
        throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, `"${String(value)}" is not a number: expressions are numeric`, nextPosition(String(value), 'word'));
      }
      case 'SymbolNode': {
        const name = asSymbol(node).name;
        const position = nextPosition(name, 'word');
        if (Object.hasOwn(ALLOWED_CONSTANTS, name)) return num(ALLOWED_CONSTANTS[name]);
        const target = names.get(name);
        if (target) return target;
        if (laterDefinitions.has(name))
          throw new FieldProblem(ENGINE_ERROR_CODES.unknownName, `"${name}" is defined later: a definition may only use earlier definitions`, position);
        if (Object.hasOwn(ALLOWED_FUNCTIONS, name))
          throw new FieldProblem(ENGINE_ERROR_CODES.unknownName, `"${name}" is a function: call it with parentheses, e.g. ${name}(x)`, position);
        throw new FieldProblem(ENGINE_ERROR_CODES.unknownName, `Unknown name "${name}": not a variable, parameter, definition or constant (pi, e)`, position);
      }
      case 'OperatorNode': {
        const o = asOperator(node);
        if (!ALLOWED_OPERATORS.has(o.fn)) {
          const at = /^[a-z]+$/.test(o.op) ? nextPosition(o.op, 'word') : Math.max(text.indexOf(o.op), 0);
          throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, `The operator "${o.op}" is not allowed: use + - * / ^ and parentheses`, at);
        }
        return op(o.fn, o.args.map(visit));
      }
      case 'FunctionNode': {
        const f = asFunction(node);
        const name = f.fn.type === 'SymbolNode' ? asSymbol(f.fn).name : '';
        const position = name ? nextPosition(name, 'word') : charPosition('(');
        if (!Object.hasOwn(ALLOWED_FUNCTIONS, name)) {
          const list = Object.keys(ALLOWED_FUNCTIONS).join(', ');
          const message = name ? `Unknown function "${name}": allowed are ${list}` : `Only named functions may be called: ${list}`;
          throw new FieldProblem(ENGINE_ERROR_CODES.unknownFunction, message, position);
        }
        const arity = ALLOWED_FUNCTIONS[name];
        if (f.args.length !== arity)
          throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, `${name} takes ${arity === 1 ? 'one argument' : `${arity} arguments`}, not ${f.args.length}`, position);
        const args = f.args.map(visit);
        return name === 'pow' ? op('pow', args) : call(name, args);
      }
      default: {
        const hint = STRUCTURE_HINTS[node.type];
        throw new FieldProblem(ENGINE_ERROR_CODES.forbiddenSyntax, hint?.message ?? `"${node.type}" expressions are not allowed`, hint ? charPosition(hint.chars) : 0);
      }
    }
  };
  return visit(root);
}

/**
 * Check a model (names, expressions) and build its internal trees.
 * Returns every field error found (one per field at most); `model` only when there are none.
 */
export function parseModel(model: Model, basePath = 'model'): { model?: ParsedModel; errors: EngineFieldError[] } {
  const errors: EngineFieldError[] = [];
  const owners = new Map<string, string>();
  const checkName = (name: string, path: string) => {
    if (RESERVED.has(name)) {
      errors.push({ code: ENGINE_ERROR_CODES.duplicateName, message: `"${name}" is reserved (a function, constant or keyword): choose another name`, path, position: 0 });
      return false;
    }
    const owner = owners.get(name);
    if (owner) {
      errors.push({ code: ENGINE_ERROR_CODES.duplicateName, message: `"${name}" is already used by ${owner}`, path, position: 0 });
      return false;
    }
    owners.set(name, path);
    return true;
  };
  model.variables.forEach((v, i) => checkName(v.name, `${basePath}.variables[${i}].name`));
  model.parameters.forEach((p, k) => checkName(p.name, `${basePath}.parameters[${k}].name`));
  model.definitions.forEach((d, j) => checkName(d.name, `${basePath}.definitions[${j}].name`));
  const names = new Map<string, Node>();
  model.variables.forEach((v, i) => names.set(v.name, sym(variableSymbol(i))));
  model.parameters.forEach((p, k) => names.set(p.name, sym(parameterSymbol(k))));
  const later = new Set(model.definitions.map((d) => d.name));
  const definitionTrees: Node[] = [];
  model.definitions.forEach((d, j) => {
    const path = `${basePath}.definitions[${j}]`;
    try {
      definitionTrees.push(convertExpression(d.expression, names, later));
    } catch (e) {
      if (!(e instanceof FieldProblem)) throw e;
      errors.push({ code: e.code, message: e.message, path: `${path}.expression`, position: e.position });
      definitionTrees.push(num(0));
    }
    later.delete(d.name);
    if (!names.has(d.name)) names.set(d.name, sym(definitionSymbol(j)));
  });
  const rhsTrees: Node[] = [];
  model.variables.forEach((v, i) => {
    try {
      rhsTrees.push(convertExpression(v.rhs, names, new Set()));
    } catch (e) {
      if (!(e instanceof FieldProblem)) throw e;
      errors.push({ code: e.code, message: e.message, path: `${basePath}.variables[${i}].rhs`, position: e.position });
    }
  });
  if (errors.length) return { errors };
  return {
    errors,
    model: {
      variables: model.variables.map((v) => v.name),
      parameters: model.parameters.map((p) => p.name),
      parameterValues: Float64Array.from(model.parameters.map((p) => p.value)),
      definitions: model.definitions.map((d) => d.name),
      definitionTrees,
      rhsTrees,
    },
  };
}
