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

/**
 * Two Brusselators coupled by diffusion (dx in x, dy in y), four variables. On the symmetric
 * branch (x, y) = (a, b/a) the Jacobian splits into the in-phase block J0 = [[b − 1, a²], [−b, −a²]]
 * and the anti-phase block J0 − 2·diag(dx, dy) (closed form, derived by hand): Hopf points at
 * b = 1 + a² (ω = a) and b = 1 + a² + 2(dx + dy) (ω² = det of the anti-phase block there).
 */
export function coupledBrusselators(a = 2, dx = 0.1, dy = 0.2, b = 1): ModelInput {
  return {
    variables: [
      { name: 'x1', rhs: 'a - (b + 1)*x1 + x1^2*y1 + dx*(x2 - x1)' },
      { name: 'y1', rhs: 'b*x1 - x1^2*y1 + dy*(y2 - y1)' },
      { name: 'x2', rhs: 'a - (b + 1)*x2 + x2^2*y2 + dx*(x1 - x2)' },
      { name: 'y2', rhs: 'b*x2 - x2^2*y2 + dy*(y1 - y2)' },
    ],
    parameters: [{ name: 'a', value: a }, { name: 'b', value: b }, { name: 'dx', value: dx }, { name: 'dy', value: dy }],
  };
}
