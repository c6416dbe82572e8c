import { ConstantNode, FunctionNode, OperatorNode, SymbolNode, type MathNode } from 'mathjs';

/**
 * Thin typed views over the mathjs expression nodes the engine uses internally. After
 * validation a tree holds only these four node kinds (parentheses are dropped).
 */
export type Node = MathNode;

export interface ConstantView { type: 'ConstantNode'; value: unknown }
export interface SymbolView { type: 'SymbolNode'; name: string }
export interface OperatorView { type: 'OperatorNode'; op: string; fn: string; args: Node[]; implicit?: boolean }
export interface FunctionView { type: 'FunctionNode'; fn: Node; args: Node[] }

export const asConstant = (n: Node) => n as unknown as ConstantView;
export const asSymbol = (n: Node) => n as unknown as SymbolView;
export const asOperator = (n: Node) => n as unknown as OperatorView;
export const asFunction = (n: Node) => n as unknown as FunctionView;

/** Name of a function call node (its callee is a symbol after validation). */
export const functionName = (n: Node): string => {
  const fn = asFunction(n).fn;
  return fn.type === 'SymbolNode' ? asSymbol(fn).name : '';
};

export const num = (value: number): Node => new ConstantNode(value) as unknown as Node;
export const sym = (name: string): Node => new SymbolNode(name) as unknown as Node;
export const call = (name: string, args: Node[]): Node =>
  new FunctionNode(new SymbolNode(name), args) as unknown as Node;

const OPS: Record<string, string> = {
  add: '+',
  subtract: '-',
  multiply: '*',
  divide: '/',
  pow: '^',
  unaryMinus: '-',
  unaryPlus: '+',
};
export const op = (fn: string, args: Node[]): Node =>
  new OperatorNode(OPS[fn] as '+', fn as 'add', args) as unknown as Node;

export const isNumber = (n: Node): boolean => n.type === 'ConstantNode' && typeof asConstant(n).value === 'number';
export const numberOf = (n: Node): number => asConstant(n).value as number;

/** Number of nodes in a tree (guards against definitions that blow up when expanded). */
export function treeSize(n: Node): number {
  let size = 0;
  const stack: Node[] = [n];
  while (stack.length) {
    const m = stack.pop()!;
    size++;
    if (m.type === 'OperatorNode') stack.push(...asOperator(m).args);
    else if (m.type === 'FunctionNode') stack.push(...asFunction(m).args);
  }
  return size;
}

/** Internal symbol names that appear in a tree. */
export function symbolsOf(n: Node, into: Set<string> = new Set()): Set<string> {
  const stack: Node[] = [n];
  while (stack.length) {
    const m = stack.pop()!;
    if (m.type === 'SymbolNode') into.add(asSymbol(m).name);
    else if (m.type === 'OperatorNode') stack.push(...asOperator(m).args);
    else if (m.type === 'FunctionNode') stack.push(...asFunction(m).args);
  }
  return into;
}
