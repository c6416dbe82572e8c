import { EngineUsageError } from '../errors.ts';
import { asOperator, asSymbol, asFunction, functionName, isNumber, numberOf, type Node } from './nodes.ts';

/**
 * Plain-JS code generation from a validated tree. The generated text contains only: numeric
 * literals (printed by Number#toString), array slots x[i], p[k], local names d_j / t_j, the
 * operators + - * / and calls to Math functions from a fixed table. User text never reaches it:
 * symbols are matched against /^[xpd]_\d+$/ and anything else is a programming error.
 */
const MATH: Record<string, (a: string) => string> = {
  exp: (a) => `Math.exp(${a})`, log: (a) => `Math.log(${a})`, sqrt: (a) => `Math.sqrt(${a})`,
  sin: (a) => `Math.sin(${a})`, cos: (a) => `Math.cos(${a})`, tan: (a) => `Math.tan(${a})`,
  sinh: (a) => `Math.sinh(${a})`, cosh: (a) => `Math.cosh(${a})`, tanh: (a) => `Math.tanh(${a})`,
  asin: (a) => `Math.asin(${a})`, acos: (a) => `Math.acos(${a})`, atan: (a) => `Math.atan(${a})`,
  abs: (a) => `Math.abs(${a})`,
  // Functions that appear in derivatives only.
  sec: (a) => `(1/Math.cos(${a}))`, csc: (a) => `(1/Math.sin(${a}))`, cot: (a) => `(1/Math.tan(${a}))`,
  sech: (a) => `(1/Math.cosh(${a}))`, csch: (a) => `(1/Math.sinh(${a}))`, coth: (a) => `(1/Math.tanh(${a}))`,
};

const BINARY: Record<string, string> = { add: '+', subtract: '-', multiply: '*', divide: '/' };

/** JS source of a numeric literal (always parenthesised so signs and exponents stay intact). */
export function literal(value: number): string {
  if (Number.isNaN(value)) return '(NaN)';
  if (!Number.isFinite(value)) return value > 0 ? '(Infinity)' : '(-Infinity)';
  return `(${String(value)})`;
}

/** JS expression computing `node`; `slot` maps an internal symbol to its JS access. */
export function emitExpression(node: Node, slot: (symbol: string) => string = defaultSlot): string {
  const emit = (n: Node): string => {
    switch (n.type) {
      case 'ConstantNode':
        if (!isNumber(n)) throw new EngineUsageError('Non-numeric constant reached code generation');
        return literal(numberOf(n));
      case 'SymbolNode':
        return slot(asSymbol(n).name);
      case 'OperatorNode': {
        const { fn, args } = asOperator(n);
        if (fn === 'unaryMinus') return `(-${emit(args[0])})`;
        if (fn === 'unaryPlus') return emit(args[0]);
        if (fn === 'pow') return emitPower(args[0], args[1], emit);
        const sign = BINARY[fn];
        if (!sign) throw new EngineUsageError('Operator outside the allowed set reached code generation', { fn });
        return `(${args.map(emit).join(sign)})`;
      }
      case 'FunctionNode': {
        const name = functionName(n);
        const f = MATH[name];
        const args = asFunction(n).args;
        if (!f || args.length !== 1) throw new EngineUsageError('Function outside the allowed set reached code generation', { name });
        return f(emit(args[0]));
      }
      default:
        throw new EngineUsageError('Node kind outside the allowed set reached code generation', { type: n.type });
    }
  };
  return emit(node);
}

/** Small integer powers of a plain slot become products (as a hand-written function would). */
function emitPower(base: Node, exponent: Node, emit: (n: Node) => string): string {
  const b = emit(base);
  if (isNumber(exponent)) {
    const k = numberOf(exponent);
    const simple = base.type === 'SymbolNode';
    if (k === 2 && simple) return `(${b}*${b})`;
    if (k === 3 && simple) return `(${b}*${b}*${b})`;
    if (k === 0.5) return `Math.sqrt(${b})`;
    if (k === -1) return `(1/${b})`;
  }
  return `Math.pow(${b},${emit(exponent)})`;
}

/** Map internal symbols x_i → x[i], p_k → p[k], d_j → d_j (a local). */
export function defaultSlot(symbol: string): string {
  const m = /^([xpd])_(\d+)$/.exec(symbol);
  if (!m) throw new EngineUsageError('Unexpected symbol reached code generation', { symbol });
  return m[1] === 'd' ? `d_${m[2]}` : `${m[1]}[${m[2]}]`;
}

/**
 * Build a function from generated statements. The body is produced only by the emitters in
 * this file from validated trees (see the note at the top); it is never user text.
 */
export function buildFunction<F>(argumentNames: string[], body: string): F {
  return new Function(...argumentNames, `"use strict";\n${body}`) as F;
}
