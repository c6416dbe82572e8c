import { derivative } from 'mathjs';
import { asFunction, asOperator, asSymbol, call, functionName, isNumber, num, numberOf, op, symbolsOf, type Node } from './nodes.ts';
import { simplifyTree } from './simplify.ts';

/** Largest expanded expression (nodes) accepted; definitions used many times can multiply sizes. */
export const EXPANDED_SIZE_MAX = 200_000;

/**
 * Replace every definition symbol d_j by its expanded tree, so a right-hand side depends on
 * variables and parameters only (derivatives then follow the chain rule through definitions).
 * Returns null when the expansion would exceed EXPANDED_SIZE_MAX nodes.
 */
export function expandDefinitions(definitionTrees: Node[], trees: Node[]): Node[] | null {
  const expanded: Node[] = [];
  const sizes: number[] = [];
  const substitute = (n: Node): Node => {
    if (n.type === 'SymbolNode') {
      const m = /^d_(\d+)$/.exec(asSymbol(n).name);
      return m ? expanded[Number(m[1])] : n;
    }
    if (n.type === 'OperatorNode') return op(asOperator(n).fn, asOperator(n).args.map(substitute));
    if (n.type === 'FunctionNode') return call(functionName(n), asFunction(n).args.map(substitute));
    return n;
  };
  const expandedSize = (n: Node): number => {
    let size = 0;
    const stack = [n];
    while (stack.length) {
      const m = stack.pop()!;
      if (m.type === 'SymbolNode') {
        const d = /^d_(\d+)$/.exec(asSymbol(m).name);
        size += d ? sizes[Number(d[1])] : 1;
      } else {
        size++;
        if (m.type === 'OperatorNode') stack.push(...asOperator(m).args);
        else if (m.type === 'FunctionNode') stack.push(...asFunction(m).args);
      }
      if (size > EXPANDED_SIZE_MAX) return size;
    }
    return size;
  };
  for (const d of definitionTrees) {
    const size = expandedSize(d);
    if (size > EXPANDED_SIZE_MAX) return null;
    sizes.push(size);
    expanded.push(substitute(d));
  }
  const out: Node[] = [];
  for (const t of trees) {
    if (expandedSize(t) > EXPANDED_SIZE_MAX) return null;
    out.push(substitute(t));
  }
  return out;
}

/**
 * Exact partial derivative ∂node/∂symbol (symbolic, mathjs `derivative` without its slow
 * simplifier, then local simplification). Returns the zero constant when `symbol` does not occur.
 */
export function partialDerivative(node: Node, symbol: string): Node {
  if (!symbolsOf(node).has(symbol)) return num(0);
  return simplifyTree(derivative(node, symbol, { simplify: false }) as Node);
}


/** True when a tree is the constant 0 (such entries are left out of generated code). */
export const isZero = (n: Node): boolean => isNumber(n) && numberOf(n) === 0;
