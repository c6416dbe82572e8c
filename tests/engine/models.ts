import type { ModelInput } from '@shared/engine/contract.ts';

/**
 * The discretised one-dimensional Bratu problem u'' + λe^u = 0 on (0, 1), u(0) = u(1) = 0, with
 * n interior grid points (second-order central differences, h = 1/(n+1)), as a model with
 * variables u1 … un and parameter lambda.
 */
export function bratuModel(n: number, lambda = 0): ModelInput {
  const inv = (n + 1) ** 2;
  const u = (i: number) => (i < 1 || i > n ? '0' : `u${i}`);
  return {
    variables: Array.from({ length: n }, (_, k) => ({ name: `u${k + 1}`, rhs: `(${u(k)} - 2*u${k + 1} + ${u(k + 2)})*${inv} + lambda*exp(u${k + 1})` })),
    parameters: [{ name: 'lambda', value: lambda }],
    definitions: [],
  };
}
